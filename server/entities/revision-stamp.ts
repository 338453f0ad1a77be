import { EntitySchema } from 'typeorm'
import type { PackageFileDto } from '../../shared/schemas/revision'

/**
 * The licensed reviewer's stamp on one plan-set revision: who stamped it with which licence and
 * certificate (copied, so later profile changes do not rewrite history), the signed plan-set PDF
 * and the stamped package in storage. Immutable (a trigger refuses changes); one per revision.
 */
export interface RevisionStamp {
  id: string
  organizationId: string
  projectId: string
  revisionId: string
  /** `XXXX-XXXX-XXXX`, Crockford base32, printed on every stamped sheet. */
  verificationId: string
  stampedBy: string
  holderName: string
  licenceNumber: string
  licenceRegion: string
  /** YYYY-MM-DD. */
  licenceExpiry: string
  certificateCommonName: string
  certificateFingerprint: string
  certificateDemo: boolean
  stampedAt: Date
  signedPdfSha256: string
  signedPdfBytes: number
  packageName: string
  packageSha256: string
  packageBytes: number
  /** The files of the stamped zip, each also kept in storage under its SHA-256. */
  files: PackageFileDto[]
  transitionId: string
  createdAt: Date
}

export const RevisionStampEntity = new EntitySchema<RevisionStamp>({
  name: 'RevisionStamp',
  tableName: 'revision_stamps',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    projectId: { name: 'project_id', type: 'uuid' },
    revisionId: { name: 'revision_id', type: 'uuid' },
    verificationId: { name: 'verification_id', type: 'text' },
    stampedBy: { name: 'stamped_by', type: 'uuid' },
    holderName: { name: 'holder_name', type: 'text' },
    licenceNumber: { name: 'licence_number', type: 'text' },
    licenceRegion: { name: 'licence_region', type: 'text' },
    licenceExpiry: { name: 'licence_expiry', type: 'date' },
    certificateCommonName: { name: 'certificate_common_name', type: 'text' },
    certificateFingerprint: { name: 'certificate_fingerprint', type: 'text' },
    certificateDemo: { name: 'certificate_demo', type: 'boolean' },
    stampedAt: { name: 'stamped_at', type: 'timestamptz' },
    signedPdfSha256: { name: 'signed_pdf_sha256', type: 'text' },
    signedPdfBytes: { name: 'signed_pdf_bytes', type: 'integer' },
    packageName: { name: 'package_name', type: 'text' },
    packageSha256: { name: 'package_sha256', type: 'text' },
    packageBytes: { name: 'package_bytes', type: 'integer' },
    files: { type: 'jsonb' },
    transitionId: { name: 'transition_id', type: 'uuid' },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
