import { z } from 'zod'
import {
  batterySchema,
  chargeControllerSchema,
  combinerSchema,
  disconnectSchema,
  impossibleModuleCurve,
  impossiblePvInput,
  inverterSchema,
  moduleSchema,
  optimizerSchema,
  pvInputSchema,
  transformerSchema,
} from './design'
import { pageQuery } from './paging'

/**
 * The organisation's equipment library. Each item's `spec` is the engine's own equipment schema
 * without the document-local `id` and `name`, so a library item drops into a design unchanged
 * (see `toDesignEquipment`). Library-only fields (manufacturer, model, module size) sit beside it.
 */

export const EQUIPMENT_KINDS = [
  'module', 'inverter', 'microinverter', 'optimizer', 'charge_controller', 'battery', 'combiner', 'disconnect', 'transformer',
] as const
export type EquipmentKind = (typeof EQUIPMENT_KINDS)[number]

const withoutDocumentKeys = { id: true, name: true } as const
type Issue = { path: (string | number)[]; message: string }
type Check<T> = (spec: T) => Issue[]

function refuse<T>(check: Check<T>) {
  return (spec: T, ctx: z.RefinementCtx) => {
    for (const issue of check(spec)) ctx.addIssue({ code: 'custom', ...issue })
  }
}

/** Irradiance at standard test conditions [W/m²] (IEC 60904-3). */
const STC_IRRADIANCE_W_PER_M2 = 1000

/** Module efficiency at STC [%]; needs the module's outline dimensions. */
export function moduleEfficiencyPercent(spec: { pmaxW: number; lengthMm: number; widthMm: number }): number {
  return (spec.pmaxW / ((spec.lengthMm / 1000) * (spec.widthMm / 1000) * STC_IRRADIANCE_W_PER_M2)) * 100
}

const moduleSpecObject = moduleSchema.omit(withoutDocumentKeys).extend({
  /** Outline dimensions, for efficiency and the array layout [mm]. */
  lengthMm: z.number().positive().max(4000),
  widthMm: z.number().positive().max(3000),
})
type ModuleSpec = z.infer<typeof moduleSpecObject>

/** Physically impossible module data: the maximum-power point lies inside the I–V curve. */
const impossibleModule: Check<ModuleSpec> = (m) => [
  ...impossibleModuleCurve(m).map((p) => ({ path: [p.field], message: p.message })),
  ...(moduleEfficiencyPercent(m) > 100
    ? [{ path: ['pmaxW'], message: `${m.pmaxW} W from ${m.lengthMm} × ${m.widthMm} mm is over 100 % efficient; check the power and the size` }]
    : []),
]

type PvInput = z.infer<typeof pvInputSchema>
/** The window checks the engine applies to an inverter in a design document, at the library's paths. */
function impossibleWindow(pv: PvInput | null): Issue[] {
  if (pv === null) return []
  return impossiblePvInput(pv).map((p) => ({ path: ['pvInput', p.field], message: p.message }))
}

const inverterBase = inverterSchema.omit(withoutDocumentKeys)
const inverterSpecObject = inverterBase.extend({ kind: z.enum(['string', 'hybrid', 'central', 'stand_alone']) })
const microinverterSpecObject = inverterBase.extend({
  kind: z.literal('microinverter'),
  pvInput: pvInputSchema,
  modulesPerUnit: inverterSchema.shape.modulesPerUnit.unwrap().unwrap(),
  maxUnitsPerBranch: inverterSchema.shape.maxUnitsPerBranch.unwrap().unwrap(),
})

/** The spec schema of each kind, with its impossibility checks (errors, not warnings). */
export const EQUIPMENT_SPECS = {
  module: moduleSpecObject.superRefine(refuse(impossibleModule)),
  inverter: inverterSpecObject.superRefine(
    refuse((inv) => [
      ...(inv.pvInput === null && inv.kind !== 'stand_alone' ? [{ path: ['pvInput'], message: `is required for a ${inv.kind} inverter` }] : []),
      ...impossibleWindow(inv.pvInput),
    ]),
  ),
  microinverter: microinverterSpecObject.superRefine(refuse((inv) => impossibleWindow(inv.pvInput))),
  optimizer: optimizerSchema.omit(withoutDocumentKeys),
  charge_controller: chargeControllerSchema.omit(withoutDocumentKeys),
  battery: batterySchema.omit(withoutDocumentKeys),
  combiner: combinerSchema.omit(withoutDocumentKeys),
  disconnect: disconnectSchema.omit(withoutDocumentKeys),
  transformer: transformerSchema.omit(withoutDocumentKeys),
} as const satisfies Record<EquipmentKind, z.ZodType>

export type EquipmentSpec<K extends EquipmentKind> = z.infer<(typeof EQUIPMENT_SPECS)[K]>

const itemFields = {
  manufacturer: z.string().trim().min(1, 'must not be empty').max(80),
  model: z.string().trim().min(1, 'must not be empty').max(120),
  notes: z.string().trim().max(2000).default(''),
}

const itemOfKind = <K extends EquipmentKind>(kind: K) =>
  z.object({ kind: z.literal(kind), ...itemFields, spec: EQUIPMENT_SPECS[kind] }).strict()

/** A library item as entered: kind, manufacturer, model, notes and the kind's spec. */
export const equipmentItemBody = z.discriminatedUnion('kind', [
  itemOfKind('module'),
  itemOfKind('inverter'),
  itemOfKind('microinverter'),
  itemOfKind('optimizer'),
  itemOfKind('charge_controller'),
  itemOfKind('battery'),
  itemOfKind('combiner'),
  itemOfKind('disconnect'),
  itemOfKind('transformer'),
])
export type EquipmentItemBody = z.infer<typeof equipmentItemBody>

/** An update replaces the whole item (its kind cannot change) and carries the version read. */
export const updateEquipmentBody = z.intersection(equipmentItemBody, z.object({ version: z.number().int().min(1) }))
export type UpdateEquipmentBody = z.infer<typeof updateEquipmentBody>

export const EQUIPMENT_SORTS = ['manufacturer', '-manufacturer', 'model', '-model', 'kind', '-kind', 'updatedAt', '-updatedAt'] as const
export const equipmentListQuery = pageQuery(EQUIPMENT_SORTS).extend({ kind: z.enum(EQUIPMENT_KINDS).optional() })
export type EquipmentListQuery = z.infer<typeof equipmentListQuery>

/** A plausibility note on entered data: saved anyway, shown beside the field. */
const fieldWarning = z.object({ field: z.string(), message: z.string() })
export type FieldWarning = z.infer<typeof fieldWarning>

const pctPerC = (c: { value: number; unit: string }, base: number) => (c.unit.startsWith('%') ? c.value : (c.value / base) * 100)
const warnIf = (condition: boolean, field: string, message: string): FieldWarning[] => (condition ? [{ field: `spec.${field}`, message }] : [])
const round = (v: number, digits = 1) => Number(v.toFixed(digits))

/** Plausibility of one inverter's output against its rated power (continuous current × voltage). */
function inverterPowerWarnings(inv: z.infer<typeof inverterBase>): FieldWarning[] {
  const apparentW = inv.acVoltageV * inv.maxContinuousOutputA * (inv.phases === 3 ? Math.sqrt(3) : 1)
  const pv = inv.pvInput
  return [
    // common practice, no source: a datasheet's rated power is within a few per cent of V × I at the output
    ...warnIf(inv.ratedPowerW > apparentW * 1.05, 'ratedPowerW', `${inv.ratedPowerW} W is more than ${round(apparentW, 0)} VA the rated output current can deliver at ${inv.acVoltageV} V`),
    ...(pv
      ? warnIf(pv.maxInputCurrentPerMpptA > pv.maxShortCircuitCurrentPerMpptA, 'pvInput.maxInputCurrentPerMpptA', 'the usable input current is normally below the short-circuit input limit')
      : []),
  ]
}

/**
 * Warnings on data that is possible but unusual, most often a typing slip (a missing decimal point,
 * a %/°C coefficient entered as V/°C). Each names its field. Ranges are typical datasheet values.
 */
export function equipmentWarnings(item: EquipmentItemBody): FieldWarning[] {
  switch (item.kind) {
    case 'module': {
      const m = item.spec
      const efficiency = moduleEfficiencyPercent(m)
      const vocPct = m.vocCoefficient ? pctPerC(m.vocCoefficient, m.vocV) : null
      const pmaxPct = pctPerC(m.pmaxCoefficient, m.pmaxW)
      const iscPct = pctPerC(m.iscCoefficient, m.iscA)
      const mpp = m.vmpV * m.impA
      return [
        // common practice, no source: commercial flat-plate modules are 5–25 % efficient
        ...warnIf(efficiency < 5 || efficiency > 25, 'pmaxW', `efficiency ${round(efficiency)} % is outside the usual 5–25 %; check the power and the dimensions`),
        // common practice, no source: datasheet Pmax equals Vmp × Imp within rounding
        ...warnIf(Math.abs(mpp - m.pmaxW) / m.pmaxW > 0.03, 'pmaxW', `Vmp × Imp is ${round(mpp)} W, not ${m.pmaxW} W`),
        // common practice, no source: crystalline silicon Voc falls 0.2–0.5 %/°C
        ...warnIf(vocPct !== null && (vocPct > -0.2 || vocPct < -0.5), 'vocCoefficient.value', `${round(vocPct ?? 0, 3)} %/°C is outside the usual −0.2 to −0.5 %/°C; check the unit`),
        ...warnIf(pmaxPct > -0.2 || pmaxPct < -0.6, 'pmaxCoefficient.value', `${round(pmaxPct, 3)} %/°C is outside the usual −0.2 to −0.6 %/°C; check the unit`),
        ...warnIf(iscPct > 0.1, 'iscCoefficient.value', `${round(iscPct, 3)} %/°C is above the usual 0 to 0.1 %/°C; check the unit`),
        ...warnIf(m.vmpV / m.vocV < 0.7, 'vmpV', `Vmp is only ${round((m.vmpV / m.vocV) * 100, 0)} % of Voc; usually 75–90 %`),
        ...warnIf(m.impA / m.iscA < 0.8, 'impA', `Imp is only ${round((m.impA / m.iscA) * 100, 0)} % of Isc; usually 85–97 %`),
      ]
    }
    case 'inverter':
    case 'microinverter':
      return inverterPowerWarnings(item.spec)
    case 'charge_controller':
      // common practice, no source: an MPPT controller needs array voltage well above the battery
      return warnIf(item.spec.maxPvVocV < item.spec.batteryVoltageV * 1.2, 'maxPvVocV', `a ${item.spec.maxPvVocV} V PV input leaves little headroom over a ${item.spec.batteryVoltageV} V battery`)
    case 'battery': {
      const ah = (item.spec.capacityKwh * 1000) / item.spec.nominalVoltageV
      const cRate = item.spec.maxContinuousDischargeA / ah
      // common practice, no source: stationary batteries discharge continuously at 1 C or less
      return warnIf(cRate > 2, 'maxContinuousDischargeA', `${round(cRate)} C continuous discharge is unusually high for ${round(ah, 0)} Ah`)
    }
    case 'disconnect':
      return warnIf(item.spec.fuseA !== null && item.spec.fuseA > item.spec.ratingA, 'fuseA', `a ${item.spec.fuseA} A fuse exceeds the ${item.spec.ratingA} A switch rating`)
    case 'transformer':
      return [
        ...warnIf(item.spec.primaryVoltageV === item.spec.secondaryVoltageV, 'secondaryVoltageV', 'primary and secondary voltages are the same'),
        // common practice, no source: distribution transformers are 1–10 % impedance
        ...warnIf(item.spec.impedancePercent < 1 || item.spec.impedancePercent > 10, 'impedancePercent', `${item.spec.impedancePercent} % impedance is outside the usual 1–10 %`),
      ]
    case 'optimizer':
      return warnIf(item.spec.maxOutputVoltageV > 1000, 'maxOutputVoltageV', 'above 1000 V is unusual for a module-level converter')
    case 'combiner':
      return []
  }
}

/** Where each kind goes in a design document's `equipment`. */
export const DESIGN_COLLECTION = {
  module: 'modules',
  inverter: 'inverters',
  microinverter: 'inverters',
  optimizer: 'optimizers',
  charge_controller: 'chargeControllers',
  battery: 'batteries',
  combiner: 'combiners',
  disconnect: 'disconnects',
  transformer: 'transformers',
} as const satisfies Record<EquipmentKind, string>

/** Library-only fields that a design document's equipment entry does not take. */
const LIBRARY_ONLY_SPEC_FIELDS = ['lengthMm', 'widthMm']

/** A library item as a design document's equipment entry under a document-local id, and the list it goes in. */
export function toDesignEquipment(item: Pick<EquipmentItemBody, 'kind' | 'manufacturer' | 'model' | 'spec'>, id: string) {
  const spec = Object.fromEntries(Object.entries(item.spec).filter(([key]) => !LIBRARY_ONLY_SPEC_FIELDS.includes(key)))
  return { collection: DESIGN_COLLECTION[item.kind], entry: { id, name: `${item.manufacturer} ${item.model}`, ...spec } }
}

/** A library item as the API answers it: the item, its warnings and its datasheet. */
export const equipmentItemDto = z.intersection(
  equipmentItemBody,
  z.object({
    id: z.uuid(),
    warnings: z.array(fieldWarning),
    datasheet: z.object({ fileName: z.string(), byteSize: z.number().int(), sha256: z.string(), uploadedAt: z.iso.datetime() }).nullable(),
    createdAt: z.iso.datetime(),
    updatedAt: z.iso.datetime(),
    version: z.number().int(),
  }),
)
export type EquipmentItemDto = z.infer<typeof equipmentItemDto>

export const csvImportReport = z.object({
  /** `all_or_nothing`: one bad row imports nothing; `valid_rows`: good rows import, bad rows are listed. */
  mode: z.enum(['all_or_nothing', 'valid_rows']),
  imported: z.number().int(),
  /** `row` counts as a spreadsheet does: the header is row 1, the first item row 2. */
  rejected: z.array(z.object({ row: z.number().int(), field: z.string(), message: z.string() })),
})
export type CsvImportReport = z.infer<typeof csvImportReport>

/** Answer of a CSV import: the report and the items it added (on 422 the report alone, beside `error`). */
export const csvImportAnswer = z.object({ report: csvImportReport, items: z.array(equipmentItemDto) })
export type CsvImportAnswer = z.infer<typeof csvImportAnswer>
