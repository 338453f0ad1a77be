/**
 * E-604 equipment schedule: every module, inverter, optimizer, charge controller, battery,
 * combiner, disconnect, transformer and panel of the design with its quantity and key ratings
 * as the design document records them, and where its datasheet is in this set.
 */
import { fmt, type Evaluation } from '../../../shared/electrical'
import type { DesignDocument } from '../../../shared/schemas/design'
import { text } from '../fonts'
import type { Sheet } from '../model'
import { frameSheet, type PlanSetContext } from './frame'
import { pagedSheetId, paginateTable, type TableColumn, type TableRow } from './table'

/** A datasheet of this set as E-604 refers to it. */
export interface AttachmentRef {
  /** A, B, … in the order the datasheets follow E-604. */
  letter: string
  equipmentName: string
  fileName: string
  /** First plan-set page of the datasheet (1-based); null when not yet known. */
  firstPage: number | null
  /** Why the file could not be merged; a placeholder page stands in for it. */
  mergeError: string | null
}

/** One line of the schedule before the datasheet column is added. */
export interface EquipmentLine { category: string; id: string; name: string; quantity: number; ratings: string }

const COLUMNS: TableColumn[] = [
  { header: 'Category', weight: 9 }, { header: 'Tag', weight: 6 }, { header: 'Description', weight: 20 }, { header: 'Qty', weight: 3 },
  { header: 'Key ratings (from the design document)', weight: 40 }, { header: 'Datasheet', weight: 14 },
]

const v = (n: number) => `${fmt(n, 1)} V`
const a = (n: number) => `${fmt(n, 2)} A`
const phase = (p: number) => (p === 3 ? '3-phase' : '1-phase')

/** Every item of the design's equipment with how many are installed. */
export function equipmentLines(doc: DesignDocument): EquipmentLine[] {
  const { equipment: e, topology: t } = doc
  const modulesOf = new Map<string, number>()
  for (const arr of t.arrays) modulesOf.set(arr.moduleId, (modulesOf.get(arr.moduleId) ?? 0) + arr.moduleCount)
  const microUnits = new Map<string, number>()
  for (const b of t.microBranches) microUnits.set(b.inverterId, (microUnits.get(b.inverterId) ?? 0) + b.units)
  const optimizers = new Map<string, number>()
  // common practice, no source: one optimizer per module of the string (the schema records no other ratio)
  for (const s of t.strings) if (s.optimizerId !== null) optimizers.set(s.optimizerId, (optimizers.get(s.optimizerId) ?? 0) + s.modulesInSeries)

  return [
    ...e.modules.map((m) => ({
      category: 'PV module', id: m.id, name: m.name, quantity: modulesOf.get(m.id) ?? 0,
      ratings: `Pmax ${fmt(m.pmaxW)} W; Voc ${v(m.vocV)}; Vmp ${v(m.vmpV)}; Isc ${a(m.iscA)}; Imp ${a(m.impA)}; max system ${v(m.maxSystemVoltageV)}; max series fuse ${fmt(m.maxSeriesFuseA)} A; ${m.cells} cells, ${m.technology === 'thin_film' ? 'thin film' : 'crystalline'}`,
    })),
    ...e.inverters.map((i) => {
      const pv = i.pvInput
      const parts = [
        `${i.kind.replace('_', '-')}; ${fmt(i.ratedPowerW)} W AC; ${v(i.acVoltageV)} ${phase(i.phases)}; max continuous output ${a(i.maxContinuousOutputA)}`,
        pv ? `DC max ${v(pv.maxDcVoltageV)}, MPPT ${fmt(pv.mpptMinV)}\u2013${fmt(pv.mpptMaxV)} V \u00d7 ${pv.mpptCount}, max input ${a(pv.maxInputCurrentPerMpptA)} and Isc ${a(pv.maxShortCircuitCurrentPerMpptA)} per MPPT` : 'no PV input',
        ...(i.backupOutputA !== null ? [`backup output ${a(i.backupOutputA)}`] : []),
        ...(i.kind === 'microinverter' ? [`${i.modulesPerUnit ?? '?'} module(s) per unit, max ${i.maxUnitsPerBranch ?? '?'} units per branch`] : []),
      ]
      return { category: 'Inverter', id: i.id, name: i.name, quantity: i.kind === 'microinverter' ? microUnits.get(i.id) ?? 0 : 1, ratings: parts.join('; ') }
    }),
    ...e.optimizers.map((o) => ({ category: 'Optimizer', id: o.id, name: o.name, quantity: optimizers.get(o.id) ?? 0, ratings: `max input ${v(o.maxInputVoltageV)}; max output ${v(o.maxOutputVoltageV)}, ${a(o.maxOutputCurrentA)}` })),
    ...e.chargeControllers.map((c) => ({ category: 'Charge controller', id: c.id, name: c.name, quantity: 1, ratings: `max PV Voc ${v(c.maxPvVocV)}; max PV current ${a(c.maxPvCurrentA)}; battery ${v(c.batteryVoltageV)}; max output ${a(c.maxOutputCurrentA)}` })),
    ...e.batteries.map((b) => ({ category: 'Battery', id: b.id, name: b.name, quantity: 1, ratings: `${fmt(b.capacityKwh, 1)} kWh; nominal ${v(b.nominalVoltageV)}; max continuous discharge ${a(b.maxContinuousDischargeA)}, charge ${a(b.maxContinuousChargeA)}; ${b.integralDisconnect ? 'integral disconnect' : 'no integral disconnect'}` })),
    ...e.combiners.map((c) => ({ category: c.current === 'dc' ? 'DC combiner' : 'AC combiner', id: c.id, name: c.name, quantity: 1, ratings: `${fmt(c.ratingA)} A; max ${v(c.maxVoltageV)}; ${c.inputs} inputs` })),
    ...e.disconnects.map((d) => ({ category: d.current === 'dc' ? 'DC disconnect' : 'AC disconnect', id: d.id, name: d.name, quantity: 1, ratings: `${fmt(d.ratingA)} A, ${v(d.voltageRatingV)}; ${d.fuseA === null ? 'non-fused' : `fused ${fmt(d.fuseA)} A`}` })),
    ...e.transformers.map((x) => ({ category: 'Transformer', id: x.id, name: x.name, quantity: 1, ratings: `${fmt(x.kva)} kVA; ${v(x.primaryVoltageV)} primary / ${v(x.secondaryVoltageV)} secondary; ${phase(x.phases)}; Z ${fmt(x.impedancePercent)} %` })),
    ...e.panels.map((p) => ({ category: 'Panelboard', id: p.id, name: p.name, quantity: 1, ratings: `${p.role.replace('_', ' ')}; busbar ${fmt(p.busbarA)} A; ${p.mainBreakerA === null ? 'main lugs only' : `main breaker ${fmt(p.mainBreakerA)} A`}; ${v(p.voltageV)} ${phase(p.phases)}; ${p.feed}-fed` })),
  ]
}

/** The attachment of an item, matched on its name or tag (case and spacing ignored). */
const key = (s: string) => s.trim().replace(/\s+/g, ' ').toLowerCase()
export function attachmentFor(line: Pick<EquipmentLine, 'id' | 'name'>, attachments: readonly AttachmentRef[]): AttachmentRef | undefined {
  return attachments.find((r) => key(r.equipmentName) === key(line.name) || key(r.equipmentName) === key(line.id))
}

const datasheetCell = (r: AttachmentRef | undefined) => {
  if (!r) return 'not attached'
  if (r.mergeError !== null) return `attachment ${r.letter}: could not be merged, see page ${r.firstPage ?? '?'}`
  return r.firstPage === null ? `Datasheet: attachment ${r.letter}` : `Datasheet: attachment ${r.letter}, page ${r.firstPage}`
}

/** The E-604 pages: `E-604`, or `E-604.1` … when the schedule runs over several. */
export function equipmentSheets(ctx: PlanSetContext, evaluation: Evaluation, attachments: readonly AttachmentRef[]): Sheet[] {
  const lines = equipmentLines(ctx.doc)
  const rows: TableRow[] = lines.map((l) => ({ cells: [l.category, l.id, l.name, String(l.quantity), l.ratings, datasheetCell(attachmentFor(l, attachments))] }))
  const unmatched = attachments.filter((r) => !lines.some((l) => attachmentFor(l, [r]) === r))
  if (unmatched.length > 0) {
    rows.push({ heading: 'Datasheets attached that name no item of this design' })
    for (const r of unmatched) rows.push({ cells: ['Attachment', r.letter, r.equipmentName, '', r.fileName, datasheetCell(r)] })
  }
  const probe = frameSheet(ctx, 'E-604', 'Equipment schedule', '')
  const content = { ...probe.content, y: probe.content.y + 14, height: probe.content.height - 14 }
  const style = { size: probe.widthPt > 2000 ? 8 : 6.5, maxLines: 4 }
  const pages = paginateTable(COLUMNS, rows, content, style)
  const heading = `EQUIPMENT SCHEDULE \u2014 ${lines.length} items; ratings as entered in the design (engine ${evaluation.engineVersion}); confirm against the approved datasheets`
  return pages.map((page, k) => {
    const id = pagedSheetId('E-604', k, pages.length)
    const frame = frameSheet(ctx, id, 'Equipment schedule', pages.length === 1 ? '' : `page ${k + 1} of ${pages.length}`)
    return {
      id, title: 'Equipment schedule', widthPt: frame.widthPt, heightPt: frame.heightPt,
      items: [...frame.items, text(heading, frame.content.x, frame.content.y + 8, { size: 8, weight: 'bold' }, frame.content.width), ...page.items],
    }
  })
}
