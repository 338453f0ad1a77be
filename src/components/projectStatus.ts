/** Plain words for the workflow states of a permit set (one list, shared with the server's messages). */
export { STATUS_LABELS as PROJECT_STATUS_LABELS } from '@shared/workflow'
