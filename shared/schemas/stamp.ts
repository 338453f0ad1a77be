import { z } from 'zod'

/** Shapes of the reviewer's stamp: the credentials on the profile, the stamping step, verification. */

/** What `approve_and_stamp` takes beyond the step itself: the password that opens the reviewer's signing certificate (never stored). */
export const stampStepBody = z
  .object({
    certificatePassword: z.string().min(1, 'is required to sign the plan set').max(200, 'must be at most 200 characters').describe('Opens the PKCS#12 signing certificate on the profile; used once and not kept'),
  })
  .strict()
export type StampStepBody = z.infer<typeof stampStepBody>

/** What still blocks stamping, each named by the profile field that fixes it. */
const credentialProblem = z.object({ field: z.string(), message: z.string() })

/** The reviewer's stamp credentials as the profile shows them (the certificate's password is never kept). */
export const stampCredentialsDto = z.object({
  stampImage: z.object({ uploadedAt: z.string(), fileName: z.string(), bytes: z.number().int() }).nullable(),
  certificate: z
    .object({
      commonName: z.string(),
      notAfter: z.string(),
      fingerprintSha256: z.string(),
      /** A generated self-signed demo certificate: not for permit use. */
      demo: z.boolean(),
    })
    .nullable(),
  licence: z.object({ number: z.string().nullable(), region: z.string().nullable(), expiry: z.string().nullable() }),
  /** Empty when the user may stamp today. */
  problems: z.array(credentialProblem),
})
export type StampCredentialsDto = z.infer<typeof stampCredentialsDto>

/** The text fields of the certificate upload form. */
export const certificateUploadBody = z
  .object({ password: z.string().min(1, 'is required to open the certificate').max(200, 'must be at most 200 characters') })
  .strict()

/** The stamp of a revision, as revision lists show it. */
export const revisionStampDto = z.object({
  verificationId: z.string(),
  stampedAt: z.string(),
  holderName: z.string(),
  licenceNumber: z.string(),
  licenceRegion: z.string(),
  signedPdfSha256: z.string(),
  demo: z.boolean(),
})
export type RevisionStampDto = z.infer<typeof revisionStampDto>

/** `XXXX-XXXX-XXXX` in Crockford base32 (no I, L, O, U). */
export const VERIFICATION_ID_PATTERN = /^[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}$/

/**
 * A typed verification id as people type it: case, spaces and dashes do not matter, and the
 * letters Crockford base32 reads as digits (O → 0, I and L → 1) are read that way.
 */
export function normalizeVerificationId(typed: string): string | null {
  const plain = typed.toUpperCase().replace(/[\s-]/g, '').replace(/O/g, '0').replace(/[IL]/g, '1')
  if (plain.length !== 12) return null
  const id = `${plain.slice(0, 4)}-${plain.slice(4, 8)}-${plain.slice(8)}`
  return VERIFICATION_ID_PATTERN.test(id) ? id : null
}

/** The facts a public verification shows: the project code, revision, stamp holder and date, nothing else. */
export const verifiedStampDto = z
  .object({
    verificationId: z.string(),
    projectCode: z.string(),
    revisionNumber: z.number().int(),
    holderName: z.string(),
    stampedAt: z.string(),
  })
  .strict()
export type VerifiedStampDto = z.infer<typeof verifiedStampDto>

export const SIGNATURE_STATES = ['unsigned', 'valid', 'altered', 'invalid'] as const
/** exact: this very file was stamped here; altered_copy: a stamped file of ours, changed since; unknown: no stamp of ours. */
export const STAMP_MATCHES = ['exact', 'altered_copy', 'unknown'] as const

/** The answer to an uploaded PDF: its signature, and the stamp it belongs to when it is one of ours. */
export const fileVerificationDto = z
  .object({
    signature: z.enum(SIGNATURE_STATES),
    /** One sentence for people, e.g. "The file was changed after signing". */
    reason: z.string(),
    match: z.enum(STAMP_MATCHES),
    /** Present when the file carries a stamp of ours (match exact or altered_copy): the same public facts as a verification id gives. */
    stamp: verifiedStampDto.nullable(),
  })
  .strict()
export type FileVerificationDto = z.infer<typeof fileVerificationDto>
