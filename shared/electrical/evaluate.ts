/**
 * Runs every rule of the engine over a design document. Pure and deterministic: the same document
 * always gives the same evaluation, with no I/O.
 */
import {
  indexNodes,
  parseDesign,
  type DesignDocument,
  type Inverter,
  type NodeEntry,
  type PvInput,
  type PvModule,
  type PvString,
  type Run,
} from '../schemas/design'
import { SAFETY_CAUTION } from './caution'
import { fmt } from './format'
import { necRef } from './reference'
import { conduitFill, selectConductorForVoltageDrop, sizeEgc, sizeOcpd } from './rules/conductors'
import { converterOutputCurrent, combinedOutputCurrent, nameplateCurrent, pvOutputMaxCurrent, pvSourceMaxCurrent } from './rules/currents'
import { essDisconnect, essMaxCurrent } from './rules/ess'
import {
  busbar100PercentRule,
  busbar120PercentRule,
  busbarSumRule,
  mainBreakerDerate,
  supplySideLimit,
  type BusbarData,
} from './rules/interconnection'
import { checkVoltageLimit, converterStringVoltage, DWELLING_DC_LIMIT_V, maxStringVoltage } from './rules/max-voltage'
import { checkMpptCurrent, checkMpptWindow, stringVmpAtCellTemperature } from './rules/mppt'
import { sourceCircuitOcpdRequired } from './rules/pv-ocpd'
import { checkNotAbove, checkNotBelow } from './rules/ratings'
import { parallelSum, seriesStringRatings } from './rules/series'
import { systemSummary } from './rules/summary'
import { transformerOcpd450_3B, transformerRatedCurrent } from './rules/transformer'
import {
  type ConductorSelectionInput,
  type ConductorSize,
  type ConduitConductor,
  type Derived,
  type EngineIssue,
  type NecEdition,
  type RacewayKind,
  type Status,
} from './types'
import { ENGINE_VERSION } from './version'

export type AnyDerived = Derived<number> | Derived<boolean>

/** A group of results printed together on the calculation sheet. */
export interface EvaluationSection {
  /** Stable id, e.g. `string.S1`, `run.R3`, `interconnection`. */
  id: string
  title: string
  group: 'summary' | 'string' | 'input' | 'branch' | 'circuit' | 'raceway' | 'path' | 'interconnection' | 'equipment'
  status: Status
  items: AnyDerived[]
}

/** The conductor schedule line of one run. Null fields were not computed (see the issues). */
export interface RunResult {
  id: string
  kind: Run['kind']
  from: string
  to: string
  lengthFt: number
  material: Run['material']
  insulation: Run['insulation']
  method: Run['method']
  racewayId: string | null
  /** Circuit (current-carrying and neutral) conductors per set: as given, or the system's usual count. */
  circuitConductors: number | null
  maxCurrentA: number | null
  /** Circuit voltage the drop is taken on [V]. */
  voltageV: number | null
  /** Smallest size that carries the current after every factor. */
  sizeForAmpacity: ConductorSize | null
  /** Size chosen after voltage-drop upsizing. */
  size: ConductorSize | null
  parallelSets: number
  /** Corrected ampacity of the circuit, all parallel sets together [A]. */
  ampacityA: number | null
  ocpdA: number | null
  egcSize: ConductorSize | null
  conduitTradeSize: string | null
  conduitFillPercent: number | null
  voltageDropV: number | null
  voltageDropPercent: number | null
  status: Status
}

export interface Evaluation {
  engineVersion: string
  /** False when the document failed validation; then only `issues` is filled. */
  valid: boolean
  edition: NecEdition | null
  caution: string
  summary: AnyDerived[]
  sections: EvaluationSection[]
  runs: RunResult[]
  issues: EngineIssue[]
  status: Status
}

const STATUS_RANK: Record<Status, number> = { info: 0, pass: 1, warn: 2, fail: 3 }

/** The worst of several statuses; `info` when there is nothing to judge. */
export function worstStatus(statuses: Iterable<Status>): Status {
  let worst: Status = 'info'
  for (const s of statuses) if (STATUS_RANK[s] > STATUS_RANK[worst]) worst = s
  return worst
}

const section = (id: string, title: string, group: EvaluationSection['group'], items: AnyDerived[]): EvaluationSection => ({
  id, title, group, items, status: worstStatus(items.map((d) => d.status)),
})

/** What a run carries, resolved from the equipment at its ends. */
interface Circuit {
  maxCurrent: Derived
  /** Current for voltage drop: Imp for PV circuits, the continuous current otherwise [A]. */
  operatingCurrentA: number
  /** Voltage the drop is a percentage of [V]. */
  voltageV: number
  /** Highest voltage the circuit sees, for equipment voltage ratings [V]. */
  maxVoltageV: number
  system: 'dc' | 'ac1' | 'ac3'
  ocpdRequired: boolean
  pvDc: boolean
}

/** One string's computed values, shared by its input group and its run. */
interface StringResult {
  string: PvString
  /** 690.8(A) maximum current of the string's circuit. */
  maxCurrent: Derived
  maxCurrentA: number
  impA: number
  vmpStcV: number
  maxVoltageV: number
}

const PV_DC_KINDS: ReadonlySet<Run['kind']> = new Set(['pv_source', 'pv_output', 'dc_dc_output'])
const RACEWAY_METHODS: ReadonlySet<Run['method']> = new Set<RacewayKind>(['EMT', 'PVC40', 'PVC80', 'RMC'])
const SOURCE_OUTPUT_KINDS: ReadonlySet<Run['kind']> = new Set(['inverter_output', 'microinverter_branch', 'ac_combiner_output', 'transformer_secondary'])
/** Above this, Table 310.16 does not apply (Article 311 does) [V]: 310.1 scope, 2020 and 2023 (from memory). */
const TABLE_310_16_MAX_V = 2000

/** A circuit whose current is an equipment rating: it runs at that current and has its own device. */
const ratedCircuit = (maxCurrent: Derived, voltageV: number, system: Circuit['system']): Circuit => ({
  maxCurrent, operatingCurrentA: maxCurrent.value, voltageV, maxVoltageV: voltageV, system, ocpdRequired: true, pvDc: false,
})
const acSystem = (phases: 1 | 3): Circuit['system'] => (phases === 3 ? 'ac3' : 'ac1')
/** The same result under another key, e.g. a string's current repeated on its run. */
const withKey = (d: Derived, key: string): Derived => ({
  key, label: d.label, value: d.value, unit: d.unit, formula: d.formula, reference: d.reference, status: d.status, message: d.message,
})

/** Circuit conductors without the EGC when the run does not say: 2 DC, 3 single-phase AC, 4 three-phase. */
const defaultCircuitConductors = (system: Circuit['system']) => (system === 'dc' ? 2 : system === 'ac1' ? 3 : 4) // common practice, no source

class DesignEvaluator {
  readonly edition: NecEdition
  readonly issues: EngineIssue[] = []
  readonly sections: EvaluationSection[] = []
  private readonly nodes: Map<string, NodeEntry>
  private readonly strings = new Map<string, StringResult>()
  /** Whether each string's circuit needs its own fuse, by string id. */
  private readonly stringOcpdRequired = new Map<string, boolean>()
  private readonly circuits = new Map<number, Circuit | null>()
  private readonly resolving = new Set<number>()
  private readonly runResults: RunResult[] = []
  private readonly runsInto = new Map<string, number[]>()
  private readonly runsFrom = new Map<string, number[]>()

  constructor(private readonly doc: DesignDocument) {
    this.edition = doc.codeBasis.necEdition
    this.nodes = indexNodes(doc)
    doc.topology.runs.forEach((run, i) => {
      this.runsInto.set(run.to, [...(this.runsInto.get(run.to) ?? []), i])
      this.runsFrom.set(run.from, [...(this.runsFrom.get(run.from) ?? []), i])
    })
  }

  private node<K extends NodeEntry['kind']>(id: string, kind: K): NodeEntry | undefined {
    const n = this.nodes.get(id)
    return n?.kind === kind ? n : undefined
  }

  private inverter(id: string | null): Inverter | undefined {
    const n = id === null ? undefined : this.node(id, 'inverter')
    return n ? this.doc.equipment.inverters[n.index] : undefined
  }

  private moduleOf(arrayId: string) {
    const array = this.doc.topology.arrays[this.node(arrayId, 'array')?.index ?? -1]
    return this.doc.equipment.modules[this.node(array?.moduleId ?? '', 'module')?.index ?? -1]
  }

  private issue(field: string, message: string, severity: EngineIssue['severity'] = 'error') {
    if (!this.issues.some((i) => i.field === field && i.message === message)) this.issues.push({ field, message, severity })
  }

  /** Issues a rule raised about "the module", placed on the array's module entry. */
  private moduleIssues(arrayId: string, issues: EngineIssue[]) {
    const array = this.doc.topology.arrays[this.node(arrayId, 'array')?.index ?? -1]
    const at = `equipment.modules[${this.node(array?.moduleId ?? '', 'module')?.index ?? 0}].`
    for (const i of issues) this.issue(i.field.replace('equipment.modules.', at), i.message, i.severity)
  }

  run(): Evaluation {
    this.evaluateStrings()
    this.evaluateInputs()
    this.evaluateBranches()
    this.evaluateRuns()
    this.evaluateRaceways()
    this.evaluatePaths()
    this.evaluateInterconnection()
    this.evaluateEquipment()
    const summary = this.summary()
    this.sections.unshift(section('summary', 'System summary', 'summary', summary))
    const hasErrors = this.issues.some((i) => i.severity === 'error')
    return {
      engineVersion: ENGINE_VERSION,
      valid: true,
      edition: this.edition,
      caution: SAFETY_CAUTION,
      summary,
      sections: this.sections,
      runs: this.runResults,
      issues: this.issues,
      status: hasErrors ? 'fail' : worstStatus(this.sections.map((s) => s.status)),
    }
  }

  // -------------------------------------------------------------------------------------------
  // Strings: series sums, 690.7 maximum voltage, hot and cold Vmp, 690.8(A) current

  private evaluateStrings() {
    const { codeBasis, equipment, project } = this.doc
    const dwelling = project.occupancy === 'one_two_family_dwelling'
    for (const s of this.doc.topology.strings) {
      const module = this.moduleOf(s.arrayId)
      if (!module) continue
      const key = `string.${s.id}`
      const n = s.modulesInSeries
      const ratings = seriesStringRatings(key, module, n)
      const items: AnyDerived[] = [ratings.vocV, ratings.vmpV, ratings.iscA, ratings.impA, ratings.powerW]
      const cold = maxStringVoltage(this.edition, `${key}.vocMax`, module, n, codeBasis.designLowC)
      if (!cold.ok) {
        this.moduleIssues(s.arrayId, cold.issues)
        this.sections.push(section(key, `String ${s.id}`, 'string', items))
        continue
      }
      items.push(cold.value)
      const optimizer = equipment.optimizers[this.node(s.optimizerId ?? '', 'optimizer')?.index ?? -1]
      let circuitVoltage = cold.value
      if (optimizer) {
        const moduleCold = maxStringVoltage(this.edition, `${key}.moduleVocMax`, module, 1, codeBasis.designLowC)
        if (moduleCold.ok) {
          items.push(checkVoltageLimit(this.edition, `${key}.optimizerInput`, moduleCold.value.value, optimizer.maxInputVoltageV, 'optimizer maximum input voltage', '110.3(B)'))
        }
        circuitVoltage = converterStringVoltage(this.edition, `${key}.converterVoltage`, optimizer.maxOutputVoltageV, n)
        items.push(circuitVoltage)
      }
      const maxV = circuitVoltage.value
      items.push(checkVoltageLimit(this.edition, `${key}.moduleLimit`, maxV, module.maxSystemVoltageV, 'module maximum system voltage', '110.3(B)'))
      if (dwelling) items.push(checkVoltageLimit(this.edition, `${key}.dwellingLimit`, maxV, DWELLING_DC_LIMIT_V, '600 V dwelling limit', '690.7'))

      const inverter = this.inverter(s.inverterId)
      const controller = equipment.chargeControllers[this.node(s.chargeControllerId ?? '', 'chargeController')?.index ?? -1]
      if (inverter?.pvInput) {
        items.push(checkVoltageLimit(this.edition, `${key}.inverterLimit`, maxV, inverter.pvInput.maxDcVoltageV, 'inverter maximum DC input voltage', '110.3(B)'))
        if (!optimizer) items.push(...this.operatingWindow(key, module, n, inverter.pvInput))
      }
      if (controller) {
        const hot = this.hotVmp(key, module, n)
        items.push(
          checkVoltageLimit(this.edition, `${key}.controllerLimit`, maxV, controller.maxPvVocV, 'charge controller maximum PV input voltage', '110.3(B)'),
          hot,
          // common practice, no source: charging needs the array about 25 % above the nominal battery voltage
          checkNotBelow({ edition: this.edition, key: `${key}.chargingVoltage`, label: 'Hot-day Vmp vs charging voltage', value: hot.value, unit: 'V', limit: 1.25 * controller.batteryVoltageV, limitName: 'charging headroom (1.25 × battery voltage)', section: null, whenCrossed: 'warn', advice: 'the array may not fully charge the battery on hot days; add modules in series.' }),
        )
      }

      const current = optimizer
        ? converterOutputCurrent(this.edition, `${key}.maxCurrent`, 'dc_dc_converter', optimizer.maxOutputCurrentA)
        : pvSourceMaxCurrent(this.edition, `${key}.maxCurrent`, module.iscA)
      items.push(current)
      this.strings.set(s.id, { string: s, maxCurrent: current, maxCurrentA: current.value, impA: module.impA, vmpStcV: ratings.vmpV.value, maxVoltageV: maxV })
      this.sections.push(section(key, `String ${s.id}`, 'string', items))
    }
  }

  /** Vmp of `n` modules in series at the hot-day cell temperature (design high plus cell rise). */
  private hotVmp(key: string, module: PvModule, n: number): Derived {
    const { designHighC, cellTemperatureRiseC } = this.doc.codeBasis
    const hot = stringVmpAtCellTemperature(`${key}.vmpHot`, 'Vmp on the hottest day', module, n, designHighC + cellTemperatureRiseC)
    hot.formula += `; cell ${fmt(designHighC, 1)} °C + ${fmt(cellTemperatureRiseC, 1)} °C rise`
    return hot
  }

  /** Hot-day and cold-day Vmp of `n` modules in series against an MPPT window. */
  private operatingWindow(key: string, module: PvModule, n: number, input: PvInput): AnyDerived[] {
    const hot = this.hotVmp(key, module, n)
    const cold = stringVmpAtCellTemperature(`${key}.vmpCold`, 'Vmp on the coldest day', module, n, this.doc.codeBasis.designLowC)
    return [hot, cold, ...checkMpptWindow(this.edition, key, hot.value, cold.value, input)]
  }

  // -------------------------------------------------------------------------------------------
  // Inputs: strings paralleled on one MPPT or charge controller

  private evaluateInputs() {
    const groups = new Map<string, StringResult[]>()
    for (const r of this.strings.values()) {
      const target = r.string.inverterId !== null ? `${r.string.inverterId}.mppt${r.string.mppt}` : `${r.string.chargeControllerId}`
      groups.set(target, [...(groups.get(target) ?? []), r])
    }
    for (const [target, members] of groups) {
      const first = members[0]!.string
      const key = `input.${target}`
      const module = this.moduleOf(first.arrayId)
      if (!module) continue
      const maxCurrent = pvOutputMaxCurrent(this.edition, `${key}.maxCurrent`, members.map((m) => m.maxCurrentA))
      const impSum = parallelSum(`${key}.impSum`, 'Operating current (sum of Imp)', 'A', members.map((m) => m.impA))
      const fuse = sourceCircuitOcpdRequired(this.edition, `${key}.ocpdRequired`, members.length, module.iscA, module.maxSeriesFuseA)
      members.forEach((m) => this.stringOcpdRequired.set(m.string.id, fuse.value))
      const items: AnyDerived[] = [maxCurrent, impSum, fuse]
      const lengths = new Set(members.map((m) => m.string.modulesInSeries))
      if (lengths.size > 1 && members.every((m) => m.string.optimizerId === null)) {
        items.push({
          key: `${key}.lengths`, label: 'String lengths on one input', value: lengths.size, unit: '-',
          formula: [...lengths].join(', ') + ' modules', reference: '', status: 'warn',
          message: 'Strings of different lengths in parallel operate at one voltage and lose energy.', // common practice, no source
        })
      }
      const inverter = this.inverter(first.inverterId)
      const controller = this.doc.equipment.chargeControllers[this.node(first.chargeControllerId ?? '', 'chargeController')?.index ?? -1]
      if (inverter?.pvInput) items.push(...checkMpptCurrent(this.edition, key, maxCurrent.value, impSum.value, inverter.pvInput))
      if (controller) {
        items.push(checkNotAbove({
          edition: this.edition, key: `${key}.controllerCurrent`, label: 'PV current vs charge controller input rating',
          value: maxCurrent.value, unit: 'A', limit: controller.maxPvCurrentA, limitName: 'charge controller maximum PV input current',
          section: '110.3(B)', whenCrossed: 'fail', advice: 'put fewer strings in parallel or use a larger controller.',
        }))
      }
      const title = inverter ? `Inverter ${first.inverterId}, MPPT ${first.mppt}` : `Charge controller ${first.chargeControllerId}`
      this.sections.push(section(key, title, 'input', items))
    }
  }

  // -------------------------------------------------------------------------------------------
  // Microinverter branches

  private evaluateBranches() {
    this.doc.topology.microBranches.forEach((b, i) => {
      const inverter = this.inverter(b.inverterId)
      const module = this.moduleOf(b.arrayId)
      if (!inverter?.pvInput || inverter.maxUnitsPerBranch === null || !module) return
      const key = `branch.${b.id}`
      const items: AnyDerived[] = []
      // Each module has its own microinverter input: the checks are those of a one-module string.
      const cold = maxStringVoltage(this.edition, `${key}.moduleVocMax`, module, 1, this.doc.codeBasis.designLowC)
      if (cold.ok) items.push(cold.value, checkVoltageLimit(this.edition, `${key}.inverterLimit`, cold.value.value, inverter.pvInput.maxDcVoltageV, 'microinverter maximum DC input voltage', '110.3(B)'))
      else this.moduleIssues(b.arrayId, cold.issues)
      const inputCurrent = pvSourceMaxCurrent(this.edition, `${key}.inputCurrent`, module.iscA)
      items.push(
        ...this.operatingWindow(key, module, 1, inverter.pvInput),
        inputCurrent,
        ...checkMpptCurrent(this.edition, key, inputCurrent.value, module.impA, inverter.pvInput),
        checkNotAbove({
          edition: this.edition, key: `${key}.units`, label: 'Microinverters on the branch', value: b.units, unit: '-',
          limit: inverter.maxUnitsPerBranch, limitName: 'maximum units per branch in the installation instructions',
          section: '110.3(B)', whenCrossed: 'fail', advice: `split topology.microBranches[${i}] into two branches.`,
        }),
        converterOutputCurrent(this.edition, `${key}.maxCurrent`, 'inverter', inverter.maxContinuousOutputA, b.units),
      )
      this.sections.push(section(key, `Microinverter branch ${b.id}`, 'branch', items))
    })
  }

  // -------------------------------------------------------------------------------------------
  // Runs: current → conductor → OCPD → voltage drop (upsizing) → EGC

  /** What a run carries; null (with an issue) when the document does not say enough. */
  private circuit(index: number): Circuit | null {
    if (this.circuits.has(index)) return this.circuits.get(index)!
    const run = this.doc.topology.runs[index]!
    if (this.resolving.has(index)) {
      this.issue(`topology.runs[${index}]`, `run "${run.id}" feeds itself through a loop of runs`)
      return null
    }
    this.resolving.add(index)
    const resolved = this.resolveCircuit(run, index)
    this.resolving.delete(index)
    this.circuits.set(index, resolved)
    return resolved
  }

  /** The circuits of the runs ending at a node, or null with an issue when there are none. */
  private feeders(nodeId: string, index: number): Circuit[] | null {
    const feeding = (this.runsInto.get(nodeId) ?? []).map((i) => this.circuit(i))
    if (feeding.length === 0) {
      this.issue(`topology.runs[${index}].from`, `nothing feeds "${nodeId}": add the run that ends there`)
      return null
    }
    return feeding.every((c) => c !== null) ? feeding : null
  }

  private resolveCircuit(run: Run, index: number): Circuit | null {
    const e = this.edition
    const key = `run.${run.id}.maxCurrent`
    const { equipment } = this.doc
    const from = this.nodes.get(run.from)!
    const to = this.nodes.get(run.to)!
    const pvDc = PV_DC_KINDS.has(run.kind)

    // A disconnect passes on what enters it.
    if (from.kind === 'disconnect') {
      const feeding = this.feeders(run.from, index)
      if (!feeding) return null
      const first = feeding[0]!
      const maxCurrent = parallelSum(key, `Current through ${run.from}`, 'A', feeding.map((c) => c.maxCurrent.value))
      maxCurrent.reference = first.maxCurrent.reference
      maxCurrent.message = `A disconnect passes on the current of the ${feeding.length} circuit(s) entering it.`
      return {
        maxCurrent, operatingCurrentA: feeding.reduce((s, c) => s + c.operatingCurrentA, 0), voltageV: first.voltageV,
        maxVoltageV: Math.max(...feeding.map((c) => c.maxVoltageV)), system: first.system, ocpdRequired: !pvDc || feeding.some((c) => c.ocpdRequired), pvDc,
      }
    }

    switch (run.kind) {
      case 'pv_source':
      case 'dc_dc_output': {
        const s = this.strings.get(run.from)
        if (!s) return null
        const maxCurrent = withKey(s.maxCurrent, key)
        return {
          maxCurrent, operatingCurrentA: s.impA, voltageV: s.vmpStcV, maxVoltageV: s.maxVoltageV, system: 'dc',
          ocpdRequired: this.stringOcpdRequired.get(s.string.id) ?? false, pvDc,
        }
      }
      case 'pv_output': {
        const members = [...this.strings.values()].filter((s) => s.string.combinerId === run.from)
        if (members.length === 0) {
          this.issue(`topology.runs[${index}].from`, `no string names combiner "${run.from}" as its combinerId`)
          return null
        }
        return {
          maxCurrent: pvOutputMaxCurrent(e, key, members.map((m) => m.maxCurrentA)),
          operatingCurrentA: members.reduce((t, m) => t + m.impA, 0),
          voltageV: Math.min(...members.map((m) => m.vmpStcV)),
          maxVoltageV: Math.max(...members.map((m) => m.maxVoltageV)), system: 'dc', ocpdRequired: true, pvDc,
        }
      }
      case 'inverter_output': {
        const inv = equipment.inverters[from.index]!
        const maxCurrent = converterOutputCurrent(e, key, 'inverter', inv.maxContinuousOutputA)
        return ratedCircuit(maxCurrent, inv.acVoltageV, acSystem(inv.phases))
      }
      case 'microinverter_branch': {
        const branch = this.doc.topology.microBranches[from.index]!
        const inv = this.inverter(branch.inverterId)!
        const maxCurrent = converterOutputCurrent(e, key, 'inverter', inv.maxContinuousOutputA, branch.units)
        return ratedCircuit(maxCurrent, inv.acVoltageV, acSystem(inv.phases))
      }
      case 'ac_combiner_output': {
        const feeding = this.feeders(run.from, index)
        if (!feeding) return null
        const maxCurrent = combinedOutputCurrent(e, key, feeding.map((c) => c.maxCurrent.value))
        return ratedCircuit(maxCurrent, feeding[0]!.voltageV, feeding[0]!.system)
      }
      case 'ess_dc': {
        const battery = equipment.batteries[from.index]!
        const maxCurrent = essMaxCurrent(e, key, battery.maxContinuousDischargeA, battery.maxContinuousChargeA)
        return ratedCircuit(maxCurrent, battery.nominalVoltageV, 'dc')
      }
      case 'charge_controller_output': {
        const cc = equipment.chargeControllers[from.index]!
        const maxCurrent = converterOutputCurrent(e, key, 'charge_controller', cc.maxOutputCurrentA)
        return ratedCircuit(maxCurrent, cc.batteryVoltageV, 'dc')
      }
      case 'dc_load': {
        const load = equipment.dcLoads[to.index]!
        const maxCurrent = nameplateCurrent(e, key, load.currentA, `DC load ${load.id}`)
        return ratedCircuit(maxCurrent, load.voltageV, 'dc')
      }
      case 'transformer_primary':
      case 'transformer_secondary': {
        const primary = run.kind === 'transformer_primary'
        const t = equipment.transformers[(primary ? to : from).index]!
        const v = primary ? t.primaryVoltageV : t.secondaryVoltageV
        const maxCurrent = transformerRatedCurrent(key, `Transformer ${primary ? 'primary' : 'secondary'} rated current`, t.kva, v, t.phases)
        return ratedCircuit(maxCurrent, v, acSystem(t.phases))
      }
      case 'service_feeder': {
        if (from.kind === 'inverter') {
          const inv = equipment.inverters[from.index]!
          const maxCurrent = converterOutputCurrent(e, key, 'inverter', inv.backupOutputA ?? inv.maxContinuousOutputA)
          return ratedCircuit(maxCurrent, inv.acVoltageV, acSystem(inv.phases))
        }
        const panel = to.kind === 'panel' ? equipment.panels[to.index] : from.kind === 'panel' ? equipment.panels[from.index] : undefined
        if (!panel) {
          this.issue(`topology.runs[${index}].to`, 'a service feeder must start at an inverter or touch a panel so its current is known')
          return null
        }
        const maxCurrent = nameplateCurrent(e, key, panel.mainBreakerA ?? panel.busbarA, `panel ${panel.id} (${panel.mainBreakerA === null ? 'busbar' : 'main breaker'})`)
        return ratedCircuit(maxCurrent, panel.voltageV, acSystem(panel.phases))
      }
    }
  }

  private evaluateRuns() {
    const { codeBasis } = this.doc
    const limits = codeBasis.voltageDropLimits
    this.doc.topology.runs.forEach((run, index) => {
      const field = `topology.runs[${index}]`
      const key = `run.${run.id}`
      const result: RunResult = {
        id: run.id, kind: run.kind, from: run.from, to: run.to, lengthFt: run.lengthFt, material: run.material,
        insulation: run.insulation, method: run.method, racewayId: run.racewayId, circuitConductors: null, maxCurrentA: null, voltageV: null,
        sizeForAmpacity: null, size: null, parallelSets: 1, ampacityA: null, ocpdA: null, egcSize: null,
        conduitTradeSize: null, conduitFillPercent: null, voltageDropV: null, voltageDropPercent: null, status: 'fail',
      }
      this.runResults.push(result)
      const circuit = this.circuit(index)
      if (!circuit) return
      const items: AnyDerived[] = [circuit.maxCurrent]
      const finish = () => {
        result.status = worstStatus(items.map((d) => d.status))
        this.sections.push(section(key, `Circuit ${run.id}: ${run.from} → ${run.to}`, 'circuit', items))
      }
      result.circuitConductors = run.circuitConductors ?? defaultCircuitConductors(circuit.system)
      result.maxCurrentA = circuit.maxCurrent.value
      result.voltageV = circuit.voltageV
      if (circuit.maxVoltageV > TABLE_310_16_MAX_V) {
        items.push({
          key: `${key}.mediumVoltage`, label: 'Medium-voltage circuit', value: circuit.maxVoltageV, unit: 'V',
          formula: `${fmt(circuit.maxVoltageV)} V > ${TABLE_310_16_MAX_V} V`, reference: necRef(this.edition, 'Article 311'), status: 'warn',
          message: 'Over 2000 V: Article 311 governs the conductors; the engine does not size them. An engineer must.',
        })
        return finish()
      }
      const outcomeFailed = (issues: EngineIssue[]) => {
        issues.forEach((i) => this.issue(`${field}.${i.field}`, i.message, i.severity))
        finish()
      }
      const limitPercent = circuit.pvDc ? limits.pvDcPercent : limits.anyCircuitPercent
      const sized = selectConductorForVoltageDrop({
        ...this.selectionInput(run, key, circuit, run.minimumSize),
        system: circuit.system, voltageV: circuit.voltageV, lengthFt: run.lengthFt, limitPercent,
        dropCurrentA: circuit.operatingCurrentA,
      })
      if (!sized.ok) return outcomeFailed(sized.issues)
      const { ampacitySelection, selection: chosen, drop } = sized.value
      items.push(...sized.value.steps)
      result.sizeForAmpacity = ampacitySelection.size
      result.size = chosen.size
      result.parallelSets = chosen.parallelSets
      result.ampacityA = chosen.ampacityA * chosen.parallelSets
      result.voltageDropV = drop.dropV
      result.voltageDropPercent = drop.dropPercent

      let ocpdA: number | null = null
      if (circuit.ocpdRequired) {
        const ocpd = sizeOcpd({
          key, edition: this.edition, maxCurrentA: circuit.maxCurrent.value, continuous: true,
          conductorAmpacityA: chosen.ampacityA * chosen.parallelSets, conductorSize: chosen.size, material: run.material,
        })
        if (!ocpd.ok) return outcomeFailed(ocpd.issues)
        items.push(...ocpd.value.steps)
        ocpdA = ocpd.value.ratingA
        const module = run.kind === 'pv_source' ? this.moduleOf(this.strings.get(run.from)?.string.arrayId ?? '') : undefined
        if (module) {
          items.push(checkNotAbove({
            edition: this.edition, key: `${key}.seriesFuse`, label: 'String fuse vs module maximum series fuse', value: ocpdA, unit: 'A',
            limit: module.maxSeriesFuseA, limitName: 'module maximum series fuse rating', section: '690.9(A)', whenCrossed: 'fail',
            advice: 'the module listing does not allow this fuse; put fewer strings in parallel.',
          }))
        }
      }
      result.ocpdA = ocpdA

      const egc = sizeEgc({
        key, edition: this.edition, ocpdRatingA: ocpdA, maxCurrentA: circuit.maxCurrent.value, material: run.material,
        phaseSizeMinimum: ampacitySelection.size, phaseSizeChosen: chosen.size, pvSystemCircuit: circuit.pvDc,
      })
      if (!egc.ok) return outcomeFailed(egc.issues)
      items.push(...egc.value.steps)
      result.egcSize = egc.value.size
      finish()
    })
  }

  /** Conductor selection for a run: every PV and storage circuit is continuous duty (690.8(B), 706.30(B)). */
  private selectionInput(run: Run, key: string, circuit: Circuit, minimumSize: ConductorSize | null): ConductorSelectionInput {
    return {
      key, edition: this.edition, maxCurrentA: circuit.maxCurrent.value, continuous: true, material: run.material,
      insulation: run.insulation, method: run.method, ambientC: this.doc.codeBasis.designHighC, rooftopHeightIn: run.rooftopHeightIn,
      currentCarryingConductors: run.currentCarryingConductors, terminalRatingC: run.terminalRatingC,
      ...(minimumSize === null ? {} : { minimumSize }),
    }
  }

  // -------------------------------------------------------------------------------------------
  // Raceways: Chapter 9 fill per conduit

  private evaluateRaceways() {
    const groups = new Map<string, number[]>()
    this.doc.topology.runs.forEach((run, i) => {
      if (!RACEWAY_METHODS.has(run.method)) return
      const id = run.racewayId ?? `run.${run.id}`
      groups.set(id, [...(groups.get(id) ?? []), i])
    })
    for (const [racewayId, members] of groups) {
      const results = members.map((i) => this.runResults[i]!)
      if (results.some((r) => r.size === null || r.egcSize === null)) continue
      // A run alone in its raceway with parallel sets takes one raceway per set (each with its EGC, 250.122(F)).
      const raceways = members.length === 1 ? results[0]!.parallelSets : 1
      const conductors: ConduitConductor[] = members.flatMap((i) => {
        const run = this.doc.topology.runs[i]!
        const r = this.runResults[i]!
        const setsHere = r.parallelSets / raceways
        return [
          { size: r.size!, insulation: run.insulation, count: r.circuitConductors! * setsHere },
          { size: r.egcSize!, insulation: run.insulation, count: setsHere },
        ]
      })
      const key = `raceway.${racewayId}`
      const fill = conduitFill({ key, edition: this.edition, raceway: this.doc.topology.runs[members[0]!]!.method as RacewayKind, conductors })
      if (!fill.ok) {
        fill.issues.forEach((i) => this.issue(`topology.runs[${members[0]}].${i.field}`, i.message, i.severity))
        continue
      }
      for (const r of results) {
        r.conduitTradeSize = fill.value.tradeSize
        r.conduitFillPercent = fill.value.fillPercent
      }
      const title = `Raceway ${racewayId.replace(/^run\./, '')}${raceways > 1 ? ` (each of ${raceways})` : ''}: ${results.map((r) => r.id).join(', ')}`
      this.sections.push(section(key, title, 'raceway', [...fill.value.steps, this.currentCarryingCheck(key, members, raceways)]))
    }
  }

  /**
   * The current-carrying conductors a raceway holds at the least, against what each of its runs
   * declared for the adjustment factor: a neutral carrying only unbalanced current and the EGC do
   * not count (310.15(E) and (F) in 2020 and 2023, 310.15(B)(5) and (B)(6) in 2017; from memory).
   */
  private currentCarryingCheck(key: string, members: number[], raceways: number): Derived {
    const perSet = (system: Circuit['system']) => (system === 'ac3' ? 3 : 2)
    const counted = members.reduce((t, i) => t + perSet(this.circuits.get(i)!.system) * (this.runResults[i]!.parallelSets / raceways), 0)
    const short = members.map((i) => this.doc.topology.runs[i]!).filter((run) => run.currentCarryingConductors < counted)
    return {
      key: `${key}.currentCarrying`, label: 'Current-carrying conductors in the raceway', value: counted, unit: '-',
      formula: `${counted} counted; declared ${members.map((i) => this.doc.topology.runs[i]!.currentCarryingConductors).join(', ')}`,
      reference: necRef(this.edition, { 2017: 'Table 310.15(B)(3)(a)', 2020: 'Table 310.15(C)(1)', 2023: 'Table 310.15(C)(1)' }),
      status: short.length === 0 ? 'pass' : 'warn',
      message: short.length === 0
        ? 'Each run\u2019s adjustment factor counts at least the conductors the raceway holds.'
        : `Run(s) ${short.map((r) => r.id).join(', ')} declare fewer current-carrying conductors than the raceway holds: their ampacity adjustment is understated.`,
    }
  }

  // -------------------------------------------------------------------------------------------
  // Cumulative voltage drop from each string or branch to the grid (or the battery, off-grid)

  private isDestination(nodeId: string): boolean {
    const node = this.nodes.get(nodeId)
    if (!node) return false
    if (node.kind === 'panel') return ['service', 'subpanel'].includes(this.doc.equipment.panels[node.index]!.role)
    if (node.kind === 'battery') return this.doc.systemKind === 'off_grid'
    return node.kind === 'pointOfInterconnection' || node.kind === 'transformer'
  }

  /** Worst drop over every run path from `nodeId` to a destination; null when none is reached. `seen` guards against loops. */
  private worstPath(nodeId: string, seen: Set<string>): { percent: number; runs: string[] } | null {
    if (this.isDestination(nodeId)) return { percent: 0, runs: [] }
    let worst: { percent: number; runs: string[] } | null = null
    for (const i of this.runsFrom.get(nodeId) ?? []) {
      const run = this.doc.topology.runs[i]!
      const drop = this.runResults[i]?.voltageDropPercent
      if (drop === null || drop === undefined || seen.has(run.to)) continue
      seen.add(run.to)
      const rest = this.worstPath(run.to, seen)
      seen.delete(run.to)
      if (rest && (!worst || drop + rest.percent > worst.percent)) worst = { percent: drop + rest.percent, runs: [run.id, ...rest.runs] }
    }
    return worst
  }

  private evaluatePaths() {
    const limit = this.doc.codeBasis.voltageDropLimits.totalPercent
    const starts = [...this.doc.topology.strings.map((s) => s.id), ...this.doc.topology.microBranches.map((b) => b.id)]
    const items: AnyDerived[] = []
    for (const start of starts) {
      const path = this.worstPath(start, new Set([start]))
      if (!path || path.runs.length === 0) continue
      const drops = path.runs.map((id) => this.runResults.find((r) => r.id === id)!.voltageDropPercent!)
      const pass = path.percent <= limit
      items.push({
        key: `path.${start}.voltageDrop`, label: `Cumulative voltage drop from ${start}`, value: path.percent, unit: '%',
        formula: `${drops.map((d) => `${fmt(d)} %`).join(' + ')} = ${fmt(path.percent)} % ${pass ? '≤' : '>'} ${fmt(limit)} %`,
        reference: necRef(this.edition, '210.19(A) and 215.2(A) informational notes'), status: pass ? 'pass' : 'warn',
        message: `${path.runs.join(' → ')}${pass ? '' : ': over the recommended total; upsize the longest runs.'} The notes recommend, they do not require.`,
      })
    }
    if (items.length > 0) this.sections.push(section('paths', 'Cumulative voltage drop', 'path', items))
  }

  // -------------------------------------------------------------------------------------------
  // Interconnection 705.11 / 705.12

  private evaluateInterconnection() {
    const tie = this.doc.interconnection
    if (!tie) return
    const e = this.edition
    const pointId = tie.method === 'supply_side' ? tie.pointId : tie.panelId
    const sources = (this.runsInto.get(pointId) ?? []).filter((i) => SOURCE_OUTPUT_KINDS.has(this.doc.topology.runs[i]!.kind))
    const sourceA = sources.reduce((s, i) => s + (this.runResults[i]?.maxCurrentA ?? 0), 0)
    const items: AnyDerived[] = [parallelSum('interconnection.sourceCurrent', 'Power source output current at the connection', 'A', sources.map((i) => this.runResults[i]?.maxCurrentA ?? 0))]
    if (sources.length === 0) this.issue('interconnection', `no inverter or combiner output run ends at "${pointId}"`, 'warning')

    if (tie.method === 'supply_side') {
      const ocpdSum = sources.reduce((s, i) => s + (this.runResults[i]?.ocpdA ?? this.runResults[i]?.maxCurrentA ?? 0), 0)
      items.push(supplySideLimit(e, 'interconnection.supplySide', sourceA, ocpdSum, tie.serviceRatingA))
    } else {
      const panel = this.doc.equipment.panels[this.node(tie.panelId, 'panel')!.index]!
      const mainA = tie.method === 'main_breaker_derate' ? tie.deratedMainBreakerA : panel.mainBreakerA!
      const bus: BusbarData = {
        busbarA: panel.busbarA, mainA, feed: panel.feed, breakerPosition: tie.breakerPosition,
        dwelling: this.doc.project.occupancy === 'one_two_family_dwelling',
      }
      if (tie.method === 'main_breaker_derate' && panel.mainBreakerA !== null && tie.deratedMainBreakerA > panel.mainBreakerA) {
        this.issue('interconnection.deratedMainBreakerA', `a derate must lower the main below its present ${panel.mainBreakerA} A`)
      }
      const rules = [
        busbar100PercentRule(e, 'interconnection.busbar100', sourceA, bus),
        busbar120PercentRule(e, 'interconnection.busbar120', sourceA, bus),
        tie.sumOfBreakersA === null ? null : busbarSumRule(e, 'interconnection.busbarSum', tie.sumOfBreakersA, panel.busbarA),
      ].filter((d): d is Derived => d !== null)
      const anyPasses = rules.some((d) => d.status === 'pass')
      // Alternatives: one passing rule is enough; a failed alternative is shown, not counted.
      items.push(...(anyPasses ? rules.map((d) => (d.status === 'fail' ? { ...d, status: 'info' as const, message: `Not met; another rule governs. ${d.message}` } : d)) : rules))
      if (!anyPasses && tie.method !== 'main_breaker_derate') {
        const derate = mainBreakerDerate(e, 'interconnection.derate', sourceA, panel.busbarA)
        if (derate) items.push(derate)
        if (tie.breakerPosition !== 'end_opposite_main') {
          items.push({
            key: 'interconnection.moveBreaker', label: 'Backfed breaker position', value: 0, unit: '-', formula: tie.breakerPosition,
            reference: necRef(e, { 2017: '705.12(B)(2)(3)(b)', 2020: '705.12(B)(3)(2)', 2023: '705.12(B)(3)(2)' }), status: 'info',
            message: 'The 120 % allowance needs the backfed breaker at the busbar end opposite the main.',
          })
        }
      }
    }
    this.sections.push(section('interconnection', `Interconnection at ${pointId} (${tie.method.replaceAll('_', ' ')})`, 'interconnection', items))
  }

  // -------------------------------------------------------------------------------------------
  // Equipment ratings, ESS disconnect, transformer protection

  private evaluateEquipment() {
    const e = this.edition
    const items: AnyDerived[] = []
    const touching = (id: string) => [...(this.runsInto.get(id) ?? []), ...(this.runsFrom.get(id) ?? [])].map((i) => this.circuits.get(i)).filter((c): c is Circuit => !!c)
    const rated = (kind: string, item: { id: string; ratingA: number }, voltageRatingV: number, currentA: number, maxV: number) => {
      items.push(checkNotAbove({ edition: e, key: `equipment.${item.id}.current`, label: `${kind} ${item.id} current rating`, value: currentA, unit: 'A', limit: item.ratingA, limitName: `${kind} current rating`, section: '110.3(B)', whenCrossed: 'fail', advice: 'choose a higher-rated unit.' }))
      items.push(checkNotAbove({ edition: e, key: `equipment.${item.id}.voltage`, label: `${kind} ${item.id} voltage rating`, value: maxV, unit: 'V', limit: voltageRatingV, limitName: `${kind} voltage rating`, section: '110.3(B)', whenCrossed: 'fail', advice: 'choose a unit rated for the circuit voltage.' }))
    }
    for (const d of this.doc.equipment.disconnects) {
      const circuits = touching(d.id)
      if (circuits.length === 0) continue
      const outgoing = (this.runsFrom.get(d.id) ?? []).map((i) => this.circuits.get(i)).filter((c): c is Circuit => !!c)
      const current = Math.max(...(outgoing.length > 0 ? outgoing : circuits).map((c) => c.maxCurrent.value))
      rated('Disconnect', d, d.voltageRatingV, current, Math.max(...circuits.map((c) => c.maxVoltageV)))
      const wrongCurrent = circuits.some((c) => (c.system === 'dc') !== (d.current === 'dc'))
      items.push({
        key: `equipment.${d.id}.currentType`, label: `Disconnect ${d.id} AC or DC rating`, value: !wrongCurrent, unit: '-',
        formula: `${d.current.toUpperCase()}-rated on ${wrongCurrent ? 'a mismatched' : 'a matching'} circuit`, reference: necRef(e, '110.3(B)'),
        status: wrongCurrent ? 'fail' : 'pass',
        message: wrongCurrent ? `A ${d.current.toUpperCase()}-rated switch cannot interrupt this circuit; use one listed for it.` : 'Rated for the kind of current it switches.',
      })
      if (d.fuseA !== null) {
        // 690.9(B) / 240.4: a fuse on a continuous circuit is at least 125 % of its current, and within the switch rating
        items.push(
          checkNotBelow({ edition: e, key: `equipment.${d.id}.fuseMinimum`, label: `Disconnect ${d.id} fuse vs 125 % of current`, value: d.fuseA, unit: 'A', limit: 1.25 * current, limitName: '125 % of the maximum current', section: '690.9(B)', whenCrossed: 'fail', advice: 'a smaller fuse would open in normal service; fit a larger one.' }),
          checkNotAbove({ edition: e, key: `equipment.${d.id}.fuseMaximum`, label: `Disconnect ${d.id} fuse vs switch rating`, value: d.fuseA, unit: 'A', limit: d.ratingA, limitName: 'switch current rating', section: '110.3(B)', whenCrossed: 'fail', advice: 'the switch is not rated for this fuse.' }),
        )
      }
    }
    for (const c of this.doc.equipment.combiners) {
      const members = [...this.strings.values()].filter((s) => s.string.combinerId === c.id)
      const feeding = (this.runsInto.get(c.id) ?? []).map((i) => this.circuits.get(i)).filter((x): x is Circuit => !!x)
      const inputs = c.current === 'dc' ? members.length : feeding.length
      if (inputs === 0) continue
      const current = c.current === 'dc' ? members.reduce((t, m) => t + m.maxCurrentA, 0) : feeding.reduce((t, x) => t + x.maxCurrent.value, 0)
      const maxV = c.current === 'dc' ? Math.max(...members.map((m) => m.maxVoltageV)) : Math.max(...feeding.map((x) => x.maxVoltageV))
      rated('Combiner', c, c.maxVoltageV, current, maxV)
      items.push(checkNotAbove({ edition: e, key: `equipment.${c.id}.inputs`, label: `Combiner ${c.id} inputs`, value: inputs, unit: '-', limit: c.inputs, limitName: 'number of combiner inputs', section: '110.3(B)', whenCrossed: 'fail', advice: 'add a combiner.' }))
    }
    for (const b of this.doc.equipment.batteries) {
      const viaDisconnect = [...(this.runsInto.get(b.id) ?? []).map((i) => this.doc.topology.runs[i]!.from), ...(this.runsFrom.get(b.id) ?? []).map((i) => this.doc.topology.runs[i]!.to)]
        .find((id) => this.nodes.get(id)?.kind === 'disconnect')
      items.push(essDisconnect(e, `equipment.${b.id}.disconnect`, b.integralDisconnect ? `integral to battery ${b.id}` : viaDisconnect ? `disconnect ${viaDisconnect}` : null))
    }
    for (const t of this.doc.equipment.transformers) {
      const primary = transformerRatedCurrent(`equipment.${t.id}.primaryCurrent`, `Transformer ${t.id} primary rated current`, t.kva, t.primaryVoltageV, t.phases)
      const secondary = transformerRatedCurrent(`equipment.${t.id}.secondaryCurrent`, `Transformer ${t.id} secondary rated current`, t.kva, t.secondaryVoltageV, t.phases)
      items.push(primary, secondary, ...transformerOcpd450_3B(e, `equipment.${t.id}.ocpd`, primary.value, secondary.value, Math.max(t.primaryVoltageV, t.secondaryVoltageV)))
    }
    if (items.length > 0) this.sections.push(section('equipment', 'Equipment ratings', 'equipment', items))
  }

  // -------------------------------------------------------------------------------------------
  // Summary

  private summary(): AnyDerived[] {
    const { equipment, topology } = this.doc
    const moduleCounts = new Map<string, number>()
    for (const a of topology.arrays) moduleCounts.set(a.moduleId, (moduleCounts.get(a.moduleId) ?? 0) + a.moduleCount)
    const microUnits = new Map<string, number>()
    for (const b of topology.microBranches) microUnits.set(b.inverterId, (microUnits.get(b.inverterId) ?? 0) + b.units)
    return systemSummary('summary', {
      modules: equipment.modules.filter((m) => moduleCounts.has(m.id)).map((m) => ({ pmaxW: m.pmaxW, count: moduleCounts.get(m.id)! })),
      inverters: equipment.inverters.map((inv) => ({ ratedPowerW: inv.ratedPowerW, count: inv.kind === 'microinverter' ? microUnits.get(inv.id) ?? 0 : 1 })),
      strings: topology.strings.length,
      microBranches: topology.microBranches.length,
      storageKwh: equipment.batteries.reduce((t, b) => t + b.capacityKwh, 0),
    })
  }
}

/**
 * Runs every rule over a validated design document: strings, inputs, microinverter branches,
 * every run (current → conductor → OCPD → voltage drop with upsizing → EGC), raceway fill,
 * cumulative voltage drop, interconnection, equipment ratings and the system summary.
 */
export function evaluateDesign(doc: DesignDocument): Evaluation {
  return new DesignEvaluator(doc).run()
}

/** Validates untrusted input first; an invalid document gives field-named issues and no results. */
export function evaluateDocument(input: unknown): Evaluation {
  const parsed = parseDesign(input)
  if (parsed.ok) return evaluateDesign(parsed.value)
  return {
    engineVersion: ENGINE_VERSION, valid: false, edition: null, caution: SAFETY_CAUTION, summary: [], sections: [], runs: [],
    issues: parsed.issues, status: 'fail',
  }
}
