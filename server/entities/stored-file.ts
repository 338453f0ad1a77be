import { EntitySchema } from 'typeorm'

/**
 * An uploaded file of one organisation. The bytes live in file storage under their SHA-256, so
 * the same file uploaded twice is kept once; the original name is display text only.
 */
export interface StoredFile {
  id: string
  organizationId: string
  sha256: string
  byteSize: number
  mediaType: string
  originalName: string
  uploadedBy: string | null
  createdAt: Date
}

export const StoredFileEntity = new EntitySchema<StoredFile>({
  name: 'StoredFile',
  tableName: 'stored_files',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    sha256: { type: 'text' },
    byteSize: { name: 'byte_size', type: 'integer' },
    mediaType: { name: 'media_type', type: 'text' },
    originalName: { name: 'original_name', type: 'text' },
    uploadedBy: { name: 'uploaded_by', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
