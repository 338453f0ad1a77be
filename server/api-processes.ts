/** What a cluster's primary tells its API processes whenever one starts listening or stops. */
export interface ApiProcessCount {
  /** API processes listening on the shared port. */
  listening: number
  /** API processes the cluster is set to run (API_PROCESSES). */
  configured: number
}

const MESSAGE_TYPE = 'stringline:api-processes'

export const apiProcessCountMessage = (count: ApiProcessCount) => ({ type: MESSAGE_TYPE, ...count })

export function isApiProcessCount(message: unknown): message is ApiProcessCount {
  return typeof message === 'object' && message !== null && (message as { type?: unknown }).type === MESSAGE_TYPE
}
