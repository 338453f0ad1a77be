import type { EquipmentKind } from '@/api/types'

export const EQUIPMENT_KIND_LABELS: Record<EquipmentKind, string> = {
  module: 'PV module',
  inverter: 'Inverter',
  microinverter: 'Microinverter',
  optimizer: 'DC optimiser',
  charge_controller: 'Charge controller',
  battery: 'Battery',
  combiner: 'Combiner',
  disconnect: 'Disconnect',
  transformer: 'Transformer',
}
