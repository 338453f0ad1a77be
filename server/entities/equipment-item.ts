import { EntitySchema } from 'typeorm'
import type { EquipmentItemBody, EquipmentKind } from '../../shared/schemas/equipment'

/** One entry of an organisation's equipment library; `spec` is validated against its kind's schema. */
export interface EquipmentItem {
  id: string
  organizationId: string
  kind: EquipmentKind
  manufacturer: string
  model: string
  notes: string
  spec: EquipmentItemBody['spec']
  datasheetFileId: string | null
  createdAt: Date
  updatedAt: Date
  version: number
}

export const EquipmentItemEntity = new EntitySchema<EquipmentItem>({
  name: 'EquipmentItem',
  tableName: 'equipment_items',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    organizationId: { name: 'organization_id', type: 'uuid' },
    kind: { type: 'text' },
    manufacturer: { type: 'text' },
    model: { type: 'text' },
    notes: { type: 'text', default: '' },
    spec: { type: 'jsonb' },
    datasheetFileId: { name: 'datasheet_file_id', type: 'uuid', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
    updatedAt: { name: 'updated_at', type: 'timestamptz', updateDate: true },
    version: { type: 'integer', version: true },
  },
})
