/**
 * Shared vocabulary of the electrical engine. Every rule returns `Derived` values so that the
 * calculation sheet, the API and the client print the same derivation; nothing on a sheet is
 * computed anywhere else.
 */

/** NFPA 70 editions the engine knows. Section numbers differ between them. */
export const NEC_EDITIONS = [2017, 2020, 2023] as const
export type NecEdition = (typeof NEC_EDITIONS)[number]

/** Outcome of one check. `info` is a computed value with nothing to compare against. */
export type Status = 'pass' | 'warn' | 'fail' | 'info'

/** One computed value with everything a plan reviewer needs to follow it. */
export interface Derived<T = number> {
  /** Stable key, e.g. `string.S1.vocMax`, used by the sheets, the CSV and review comments. */
  key: string
  /** Short human label, e.g. "Maximum string voltage". */
  label: string
  value: T
  /** Unit symbol: V, A, W, %, AWG, in², ft, °C, '-' for dimensionless. */
  unit: string
  /** The formula with the numbers put in, e.g. "12 × 49.5 V × (1 + (−0.27 %/°C) × (−18 − 25) °C)". */
  formula: string
  /** Code reference for the adopted edition, e.g. "NEC 2023 690.7(A)(1)". Empty when none applies. */
  reference: string
  status: Status
  /** Plain message saying why the status is what it is. */
  message: string
}

/**
 * A typed problem with the input: names the field (a JSON path into the design document, e.g.
 * `strings[2].modulesInSeries`) and the reason. Rules return these instead of NaN or throwing.
 */
export interface EngineIssue {
  field: string
  message: string
  /** `error` stops the affected calculation; `warning` lets it continue. */
  severity: 'error' | 'warning'
}

/** Either a value or the issues that prevented it. */
export type Outcome<T> = { ok: true; value: T } | { ok: false; issues: EngineIssue[] }

export type ConductorMaterial = 'Cu' | 'Al'

/** Insulation types the engine knows (Table 310.4(A) / 310.104(A) names). */
export const INSULATIONS = ['THWN-2', 'XHHW-2', 'USE-2', 'PV'] as const
export type Insulation = (typeof INSULATIONS)[number]

/** Wiring methods. Raceway kinds name their Chapter 9 Table 4 article. */
export const WIRING_METHODS = ['EMT', 'PVC40', 'PVC80', 'RMC', 'FREE_AIR', 'CABLE'] as const
export type WiringMethod = (typeof WIRING_METHODS)[number]
export type RacewayKind = Extract<WiringMethod, 'EMT' | 'PVC40' | 'PVC80' | 'RMC'>

/** Insulation temperature column of Tables 310.16 / 310.17 [°C]. */
export type TemperatureColumn = 60 | 75 | 90

/**
 * Conductor sizes in ascending order: AWG as '14'…'1', '1/0'…'4/0', then kcmil as '250'…'2000'.
 * The order of this list is the order of "next size up".
 */
export const CONDUCTOR_SIZES = [
  '18', '16', '14', '12', '10', '8', '6', '4', '3', '2', '1', '1/0', '2/0', '3/0', '4/0',
  '250', '300', '350', '400', '500', '600', '700', '750', '800', '900', '1000', '1250', '1500',
  '1750', '2000',
] as const
export type ConductorSize = (typeof CONDUCTOR_SIZES)[number]

/** Circuit kinds of a conductor run, named as the trade names them. */
export const CIRCUIT_KINDS = [
  'pv_source', // PV string / source circuit (690.2)
  'pv_output', // PV output circuit, e.g. combiner to inverter (690.2)
  'dc_dc_output', // DC-to-DC converter output (optimiser strings)
  'inverter_output', // inverter AC output circuit
  'microinverter_branch', // AC branch of microinverters
  'ac_combiner_output', // AC combiner panel to service / transformer
  'ess_dc', // battery / ESS DC circuit (706)
  'charge_controller_output', // charge controller to battery
  'dc_load', // off-grid DC load feeder
  'transformer_primary',
  'transformer_secondary',
  'service_feeder', // any other AC feeder, e.g. to a backup-loads panel
] as const
export type CircuitKind = (typeof CIRCUIT_KINDS)[number]

/** Input for conductor selection (690.8(B), 310.14–310.17, 110.14(C), 240.4(D)). */
export interface ConductorSelectionInput {
  /** Result key prefix, e.g. `run.R3`. */
  key: string
  edition: NecEdition
  /** Maximum circuit current from 690.8(A) or the equipment rating [A]. */
  maxCurrentA: number
  /** Whether the 125 % continuous-duty factor applies (true for every PV circuit). */
  continuous: boolean
  material: ConductorMaterial
  insulation: Insulation
  method: WiringMethod
  /** Design ambient (high) temperature [°C], before any rooftop adder. */
  ambientC: number
  /** Height of the raceway or cable above the roof [in]; null when not on a rooftop. */
  rooftopHeightIn: number | null
  /** Current-carrying conductors in the raceway or cable [-]. */
  currentCarryingConductors: number
  /** Lowest temperature rating of the terminations at either end [°C]. */
  terminalRatingC: TemperatureColumn
  /** Minimum size the caller requires (e.g. 690.31 or equipment instructions), if any. */
  minimumSize?: ConductorSize
}

export interface ConductorSelection {
  size: ConductorSize
  /** Conductors in parallel per phase/pole (1 unless the current exceeds the largest size). */
  parallelSets: number
  /** Corrected and adjusted ampacity of one conductor of the chosen size [A] (per set). */
  ampacityA: number
  /** Every step: required ampacity both ways, each factor, the table value, 240.4(D), result. */
  steps: Derived[]
}

/** Input for overcurrent-device sizing (690.9, 240.4, 240.6(A)). */
export interface OcpdSizingInput {
  key: string
  edition: NecEdition
  maxCurrentA: number
  continuous: boolean
  /** Corrected ampacity of the conductor the device must protect [A]. */
  conductorAmpacityA: number
  conductorSize: ConductorSize
  material: ConductorMaterial
}

export interface OcpdSizing {
  /** Standard rating chosen [A]. */
  ratingA: number
  steps: Derived[]
}

/** Input for voltage drop (Chapter 9 Tables 8 and 9). */
export interface VoltageDropInput {
  key: string
  edition: NecEdition
  /** 'dc', 'ac1' (single phase) or 'ac3' (three phase). */
  system: 'dc' | 'ac1' | 'ac3'
  currentA: number
  /** Circuit voltage the drop is a percentage of [V]. */
  voltageV: number
  /** One-way length [ft]. */
  lengthFt: number
  size: ConductorSize
  material: ConductorMaterial
  parallelSets: number
  /** Raceway for Table 9 (AC); ignored for DC. */
  method: WiringMethod
  /** Power factor for Table 9 effective Z; default 0.85 is Table 9's own note basis. */
  powerFactor?: number
  /** Limit for this circuit [%] from the code basis. */
  limitPercent: number
}

export interface VoltageDrop {
  dropV: number
  dropPercent: number
  steps: Derived[]
}

/** Input for the equipment grounding conductor (250.122, 690.45). */
export interface EgcSizingInput {
  key: string
  edition: NecEdition
  /** Rating of the overcurrent device ahead of the circuit [A]; for PV circuits without one, 690.45 uses the circuit's max current. */
  ocpdRatingA: number | null
  maxCurrentA: number
  material: ConductorMaterial
  /** Circuit conductors were upsized for voltage drop: 250.122(B) proportional increase. */
  phaseSizeMinimum: ConductorSize
  phaseSizeChosen: ConductorSize
  /**
   * PV system circuit: 690.45 applies (no increase for voltage drop). Defaults to false, which
   * applies the 250.122(B) increase: the larger, conservative result.
   */
  pvSystemCircuit?: boolean
}

export interface EgcSizing {
  size: ConductorSize
  steps: Derived[]
}

/** One group of like conductors in a raceway for the fill calculation. */
export interface ConduitConductor {
  size: ConductorSize
  insulation: Insulation
  count: number
}

export interface ConduitFillInput {
  key: string
  edition: NecEdition
  raceway: RacewayKind
  conductors: ConduitConductor[]
}

export interface ConduitFill {
  /** Trade size, e.g. '3/4'. */
  tradeSize: string
  fillPercent: number
  steps: Derived[]
}
