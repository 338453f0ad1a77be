import type { DesignDocument } from '@shared/schemas/design'

export type EquipmentCollection = keyof DesignDocument['equipment']

/** One editable field of an equipment entry; `path` is dotted inside the entry (`pvInput.mpptMinV`). */
export interface EquipmentColumn {
  path: string
  label: string
  type: 'text' | 'number' | 'select' | 'boolean'
  options?: ReadonlyArray<{ value: string | number; label: string }>
  /** A number that may be left empty (null), e.g. a non-fused disconnect's fuse. */
  nullable?: boolean
  width?: number
}

const name: EquipmentColumn = { path: 'name', label: 'Name', type: 'text', width: 200 }
const num = (path: string, label: string, nullable = false): EquipmentColumn => ({ path, label, type: 'number', nullable, width: 96 })
const phases: EquipmentColumn = { path: 'phases', label: 'Phases', type: 'select', options: [{ value: 1, label: '1' }, { value: 3, label: '3' }], width: 76 }
const acDc: EquipmentColumn = { path: 'current', label: 'AC/DC', type: 'select', options: [{ value: 'dc', label: 'DC' }, { value: 'ac', label: 'AC' }], width: 76 }

/** The fields a designer checks or adjusts per kind of equipment, with units in the label. */
export const EQUIPMENT_COLUMNS: Record<EquipmentCollection, EquipmentColumn[]> = {
  modules: [
    name, num('pmaxW', 'Pmax W'), num('vocV', 'Voc V'), num('vmpV', 'Vmp V'), num('iscA', 'Isc A'), num('impA', 'Imp A'),
    num('vocCoefficient.value', 'Voc coeff.'), num('pmaxCoefficient.value', 'Pmax coeff.'), num('maxSeriesFuseA', 'Series fuse A'),
    num('maxSystemVoltageV', 'Max system V'),
  ],
  inverters: [
    name,
    { path: 'kind', label: 'Kind', type: 'select', width: 120, options: [
      { value: 'string', label: 'String' }, { value: 'hybrid', label: 'Hybrid' }, { value: 'microinverter', label: 'Micro' },
      { value: 'central', label: 'Central' }, { value: 'stand_alone', label: 'Stand-alone' },
    ] },
    num('ratedPowerW', 'Rated W'), num('acVoltageV', 'AC V'), phases, num('maxContinuousOutputA', 'Output A'),
    num('pvInput.maxDcVoltageV', 'Max DC V'), num('pvInput.mpptMinV', 'MPPT min V'), num('pvInput.mpptMaxV', 'MPPT max V'),
    num('pvInput.startVoltageV', 'Start V'), num('pvInput.mpptCount', 'MPPTs'), num('pvInput.maxInputCurrentPerMpptA', 'Input A / MPPT'),
    num('pvInput.maxShortCircuitCurrentPerMpptA', 'Isc A / MPPT'),
  ],
  optimizers: [name, num('maxOutputVoltageV', 'Max out V'), num('maxOutputCurrentA', 'Max out A'), num('maxInputVoltageV', 'Max in V')],
  chargeControllers: [name, num('maxPvVocV', 'Max PV Voc V'), num('maxPvCurrentA', 'Max PV A'), num('batteryVoltageV', 'Battery V'), num('maxOutputCurrentA', 'Output A')],
  batteries: [
    name, num('nominalVoltageV', 'Nominal V'), num('capacityKwh', 'kWh'), num('maxContinuousDischargeA', 'Discharge A'),
    num('maxContinuousChargeA', 'Charge A'), { path: 'integralDisconnect', label: 'Own disconnect', type: 'boolean', width: 110 },
  ],
  combiners: [name, acDc, num('ratingA', 'Rating A'), num('maxVoltageV', 'Max V'), num('inputs', 'Inputs')],
  disconnects: [name, acDc, num('ratingA', 'Rating A'), num('voltageRatingV', 'Rated V'), num('fuseA', 'Fuse A', true)],
  transformers: [name, num('kva', 'kVA'), num('primaryVoltageV', 'Primary V'), num('secondaryVoltageV', 'Secondary V'), phases, num('impedancePercent', 'Z %')],
  panels: [
    name,
    { path: 'role', label: 'Role', type: 'select', width: 130, options: [
      { value: 'service', label: 'Service' }, { value: 'subpanel', label: 'Subpanel' }, { value: 'backup_loads', label: 'Backup loads' }, { value: 'ac_loads', label: 'AC loads' },
    ] },
    num('busbarA', 'Busbar A'), num('mainBreakerA', 'Main A', true), num('voltageV', 'Voltage V'), phases,
    { path: 'feed', label: 'Fed at', type: 'select', width: 96, options: [{ value: 'end', label: 'End' }, { value: 'centre', label: 'Centre' }] },
  ],
  dcLoads: [name, num('voltageV', 'Voltage V'), num('currentA', 'Current A')],
  pointsOfInterconnection: [name, num('voltageV', 'Voltage V'), phases],
}

/** A new entry of each kind, to be adjusted in place to the chosen product. */
// common practice, no source: typical residential and light-commercial ratings as starting values
export const BLANK_EQUIPMENT: Record<Exclude<EquipmentCollection, 'modules' | 'inverters' | 'optimizers'>, (id: string) => Record<string, unknown>> = {
  chargeControllers: (id) => ({ id, name: 'Charge controller', maxPvVocV: 150, maxPvCurrentA: 40, batteryVoltageV: 48, maxOutputCurrentA: 60 }),
  batteries: (id) => ({ id, name: 'Battery', nominalVoltageV: 51.2, maxContinuousDischargeA: 100, maxContinuousChargeA: 100, capacityKwh: 10, integralDisconnect: false }),
  combiners: (id) => ({ id, name: 'Combiner', current: 'dc', maxVoltageV: 600, ratingA: 60, inputs: 4 }),
  disconnects: (id) => ({ id, name: 'Disconnect', current: 'ac', ratingA: 60, voltageRatingV: 240, fuseA: null }),
  transformers: (id) => ({ id, name: 'Transformer', kva: 75, primaryVoltageV: 480, secondaryVoltageV: 208, phases: 3, impedancePercent: 5.75 }),
  panels: (id) => ({ id, name: 'Panelboard', role: 'subpanel', busbarA: 125, mainBreakerA: 100, voltageV: 240, phases: 1, feed: 'end' }),
  dcLoads: (id) => ({ id, name: 'DC load', voltageV: 48, currentA: 10 }),
  pointsOfInterconnection: (id) => ({ id, name: 'Point of interconnection', voltageV: 12470, phases: 3 }),
}

export function readPath(entry: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((value, key) => (value && typeof value === 'object' ? (value as Record<string, unknown>)[key] : undefined), entry)
}

/** Writes a dotted path; a missing parent (an inverter with no PV input) is left alone. */
export function writePath(entry: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.')
  const last = keys.pop()!
  const parent = keys.reduce<unknown>((node, key) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined), entry)
  if (parent && typeof parent === 'object') (parent as Record<string, unknown>)[last] = value
}
