import type { DueItemKind } from '@shared/schemas/submission'

/** What each kind of due item asks of the coordinator, in a word or two. */
export const DUE_ITEM_KIND_LABELS: Record<DueItemKind, string> = {
  corrections_response: 'Corrections response',
  fee_payment: 'Fee payment',
  inspection: 'Inspection',
  permit_expiry: 'Permit expiry',
}
