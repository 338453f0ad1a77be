import type { FileVerificationDto, VerifiedStampDto } from '@shared/schemas/stamp'
import { errorFromResponse, networkError, unreadableAnswer } from './errors'

/*
 * Public verification: whoever holds a stamped sheet asks without signing in, so these calls use
 * plain fetch and never carry the session's token or cookies.
 */

async function send<T>(path: string, init: RequestInit): Promise<T> {
  let response: Response
  try {
    response = await globalThis.fetch(`/api${path}`, { ...init, credentials: 'omit', headers: { Accept: 'application/json' } })
  } catch (cause) {
    throw networkError(cause)
  }
  if (!response.ok) throw await errorFromResponse(response)
  try {
    return (await response.json()) as T
  } catch (cause) {
    throw unreadableAnswer(response.status, cause)
  }
}

export const verifyApi = {
  /** The public facts of the stamp a verification id names; 404 when none does. */
  lookUp: (verificationId: string) => send<VerifiedStampDto>(`/verify/${encodeURIComponent(verificationId)}`, { method: 'GET' }),
  /** Checks a PDF's signature and whether it is a stamped file of ours. Nothing is stored. */
  checkFile: (file: File) => {
    const form = new FormData()
    form.set('file', file)
    return send<FileVerificationDto>('/verify', { method: 'POST', body: form })
  },
}
