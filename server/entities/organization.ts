import { EntitySchema } from 'typeorm'

/** An installer organisation: the tenant boundary. Nothing crosses it. */
export interface Organization {
  id: string
  name: string
  /** Short unique handle, lower case, used in file names and the demo loader. */
  slug: string
  createdAt: Date
}

export const OrganizationEntity = new EntitySchema<Organization>({
  name: 'Organization',
  tableName: 'organizations',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    name: { type: 'text' },
    slug: { type: 'text', unique: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
