import { EntitySchema } from 'typeorm'
import type { NecEdition } from '../../shared/electrical/types'
import type { SheetSize, SubmissionMethod } from '../../shared/schemas/jurisdiction'

/** How one AHJ wants plan sets: adopted code, design temperatures, sheets, labels, notes, submission. */
export interface JurisdictionProfile {
  id: string
  organizationId: string
  name: string
  necEdition: NecEdition
  /** Design temperatures [°C] that seed a design's code basis. */
  designLowC: number
  designHighC: number
  sheetSize: SheetSize
  /** NEC sections of the labels this AHJ requires. */
  requiredLabels: string[]
  generalNotesTemplate: string
  submissionMethod: SubmissionMethod
  submissionContact: string | null
  submissionEmail: string | null
  submissionPhone: string | null
  submissionUrl: string | null
  submissionAddress: string | null
  feeNotes: string
  createdAt: Date
  updatedAt: Date
  version: number
}

export const JurisdictionProfileEntity = new EntitySchema<JurisdictionProfile>({
  name: 'JurisdictionProfile',
  tableName: 'jurisdiction_profiles',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    name: { type: 'text' },
    necEdition: { name: 'nec_edition', type: 'integer' },
    designLowC: { name: 'design_low_c', type: 'double precision' },
    designHighC: { name: 'design_high_c', type: 'double precision' },
    sheetSize: { name: 'sheet_size', type: 'text' },
    requiredLabels: { name: 'required_labels', type: 'jsonb' },
    generalNotesTemplate: { name: 'general_notes_template', type: 'text' },
    submissionMethod: { name: 'submission_method', type: 'text' },
    submissionContact: { name: 'submission_contact', type: 'text', nullable: true },
    submissionEmail: { name: 'submission_email', type: 'text', nullable: true },
    submissionPhone: { name: 'submission_phone', type: 'text', nullable: true },
    submissionUrl: { name: 'submission_url', type: 'text', nullable: true },
    submissionAddress: { name: 'submission_address', type: 'text', nullable: true },
    feeNotes: { name: 'fee_notes', type: 'text' },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    updatedAt: { name: 'updated_at', type: 'timestamptz', updateDate: true },
    version: { type: 'integer', version: true },
  },
})
