/**
 * Demo designs: an invented installer ("Larkspur Valley Solar Co.") in the invented town of Cedar
 * Hollow, with generic equipment. Invented data, for the demo and the benchmark only; every value
 * here is made up to look like a plausible datasheet, not copied from one.
 */
import { parseDesign, type DesignDocument, type DesignDocumentInput } from '../schemas/design'

type EquipmentInput = DesignDocumentInput['equipment']
type ModuleInput = EquipmentInput['modules'][number]
type InverterInput = NonNullable<EquipmentInput['inverters']>[number]
type PanelInput = NonNullable<EquipmentInput['panels']>[number]
type RunInput = NonNullable<DesignDocumentInput['topology']['runs']>[number]
type StringInput = NonNullable<DesignDocumentInput['topology']['strings']>[number]

const INSTALLER = 'Larkspur Valley Solar Co.'
const PLACE = {
  city: 'Cedar Hollow',
  jurisdiction: 'Cedar Hollow Building Department',
  utility: 'Hollow Creek Electric Cooperative',
} as const

/** Cedar Hollow's (invented) design temperatures, adopted 2023 edition. */
const CEDAR_HOLLOW_BASIS: DesignDocumentInput['codeBasis'] = {
  necEdition: 2023,
  designLowC: -18,
  designHighC: 36,
  cellTemperatureRiseC: 25,
}

const MODULE_400: ModuleInput = {
  id: 'MOD400',
  name: 'Generic 400 W mono module',
  pmaxW: 400,
  vocV: 37.1,
  vmpV: 31.0,
  iscA: 13.8,
  impA: 12.9,
  vocCoefficient: { value: -0.27, unit: '%/°C' },
  pmaxCoefficient: { value: -0.35, unit: '%/°C' },
  iscCoefficient: { value: 0.048, unit: '%/°C' },
  cells: 108,
  maxSeriesFuseA: 25,
  maxSystemVoltageV: 1000,
}

const MODULE_420_UTILITY: ModuleInput = {
  id: 'MOD420',
  name: 'Generic 420 W mono module, 1500 V',
  pmaxW: 420,
  vocV: 49.5,
  vmpV: 41.5,
  iscA: 10.9,
  impA: 10.12,
  vocCoefficient: { value: -0.27, unit: '%/°C' },
  vmpCoefficient: { value: -0.31, unit: '%/°C' },
  pmaxCoefficient: { value: -0.35, unit: '%/°C' },
  iscCoefficient: { value: 0.05, unit: '%/°C' },
  cells: 144,
  maxSeriesFuseA: 25,
  maxSystemVoltageV: 1500,
}

const RESIDENTIAL_PV_INPUT = {
  maxDcVoltageV: 600,
  mpptMinV: 100,
  mpptMaxV: 480,
  startVoltageV: 120,
  mpptCount: 2,
  maxInputCurrentPerMpptA: 15,
  maxShortCircuitCurrentPerMpptA: 20,
}

const STRING_INVERTER_7600: InverterInput = {
  id: 'INV1',
  name: 'Generic 7.6 kW string inverter',
  kind: 'string',
  pvInput: RESIDENTIAL_PV_INPUT,
  acVoltageV: 240,
  phases: 1,
  maxContinuousOutputA: 32,
  ratedPowerW: 7600,
}

const servicePanel = (busbarA: number, mainBreakerA: number): PanelInput => ({
  id: 'MSP',
  name: 'Main service panel',
  role: 'service',
  busbarA,
  mainBreakerA,
  voltageV: 240,
  phases: 1,
  feed: 'end',
})

/** Run defaults of a residential job: copper THWN-2 in EMT, 75 °C terminals, not on the roof. */
const run = (r: Pick<RunInput, 'id' | 'from' | 'to' | 'kind' | 'lengthFt'> & Partial<RunInput>): RunInput => ({
  material: 'Cu',
  insulation: 'THWN-2',
  method: 'EMT',
  rooftopHeightIn: null,
  currentCarryingConductors: 2,
  terminalRatingC: 75,
  ...r,
})

const project = (name: string, code: string, owner: string, siteAddress: string, occupancy: 'one_two_family_dwelling' | 'other') => ({
  name, code, owner, installer: INSTALLER, siteAddress, ...PLACE, occupancy,
})

/** (1) Grid-tied string inverter with net metering: two strings of ten on a 7.6 kW inverter. */
const gridTied: DesignDocumentInput = {
  schemaVersion: 1,
  systemKind: 'grid_tied',
  project: project('Marsh residence PV', 'CH-0101', 'Dana Marsh', '14 Quillon Lane', 'one_two_family_dwelling'),
  codeBasis: CEDAR_HOLLOW_BASIS,
  equipment: {
    modules: [MODULE_400],
    inverters: [STRING_INVERTER_7600],
    disconnects: [{ id: 'ACD', name: 'AC disconnect, non-fused', current: 'ac', ratingA: 60, voltageRatingV: 240 }],
    panels: [servicePanel(200, 200)],
  },
  interconnection: { method: 'load_side_breaker', panelId: 'MSP', breakerPosition: 'end_opposite_main' },
  topology: {
    arrays: [{ id: 'A1', name: 'South roof', mount: 'roof', moduleId: 'MOD400', moduleCount: 20, tiltDeg: 26, azimuthDeg: 180 }],
    strings: [
      { id: 'S1', arrayId: 'A1', modulesInSeries: 10, inverterId: 'INV1', mppt: 1 },
      { id: 'S2', arrayId: 'A1', modulesInSeries: 10, inverterId: 'INV1', mppt: 2 },
    ],
    runs: [
      run({ id: 'R1', from: 'S1', to: 'INV1', kind: 'pv_source', lengthFt: 65, racewayId: 'C1', rooftopHeightIn: 1, currentCarryingConductors: 4, terminalRatingC: 90 }),
      run({ id: 'R2', from: 'S2', to: 'INV1', kind: 'pv_source', lengthFt: 65, racewayId: 'C1', rooftopHeightIn: 1, currentCarryingConductors: 4, terminalRatingC: 90 }),
      run({ id: 'R3', from: 'INV1', to: 'ACD', kind: 'inverter_output', lengthFt: 10 }),
      run({ id: 'R4', from: 'ACD', to: 'MSP', kind: 'inverter_output', lengthFt: 15 }),
    ],
  },
}

/** (2) Grid-tied hybrid inverter with a 48 V battery and a backup-loads panel. */
const gridTiedStorage: DesignDocumentInput = {
  schemaVersion: 1,
  systemKind: 'grid_tied_storage',
  project: project('Okafor residence PV and storage', 'CH-0102', 'Ngozi Okafor', '7 Alder Rise', 'one_two_family_dwelling'),
  codeBasis: CEDAR_HOLLOW_BASIS,
  equipment: {
    modules: [MODULE_400],
    inverters: [{
      id: 'HYB1', name: 'Generic 7.6 kW hybrid inverter', kind: 'hybrid', pvInput: RESIDENTIAL_PV_INPUT,
      acVoltageV: 240, phases: 1, maxContinuousOutputA: 32, ratedPowerW: 7600, backupOutputA: 40,
    }],
    batteries: [{ id: 'BAT1', name: 'Generic 15 kWh LFP battery, 51.2 V', nominalVoltageV: 51.2, maxContinuousDischargeA: 150, maxContinuousChargeA: 120, capacityKwh: 15.4 }],
    disconnects: [{ id: 'BDC', name: 'Battery DC disconnect, fused', current: 'dc', ratingA: 250, voltageRatingV: 125, fuseA: 200 }],
    panels: [
      servicePanel(200, 200),
      { id: 'BLP', name: 'Backup loads panel', role: 'backup_loads', busbarA: 100, mainBreakerA: null, voltageV: 240, phases: 1, feed: 'end' },
    ],
  },
  interconnection: { method: 'load_side_breaker', panelId: 'MSP', breakerPosition: 'end_opposite_main' },
  topology: {
    arrays: [{ id: 'A1', name: 'West roof', mount: 'roof', moduleId: 'MOD400', moduleCount: 24, tiltDeg: 22, azimuthDeg: 250 }],
    strings: [
      { id: 'S1', arrayId: 'A1', modulesInSeries: 12, inverterId: 'HYB1', mppt: 1 },
      { id: 'S2', arrayId: 'A1', modulesInSeries: 12, inverterId: 'HYB1', mppt: 2 },
    ],
    runs: [
      run({ id: 'R1', from: 'S1', to: 'HYB1', kind: 'pv_source', lengthFt: 80, racewayId: 'C1', rooftopHeightIn: 1, currentCarryingConductors: 4, terminalRatingC: 90 }),
      run({ id: 'R2', from: 'S2', to: 'HYB1', kind: 'pv_source', lengthFt: 80, racewayId: 'C1', rooftopHeightIn: 1, currentCarryingConductors: 4, terminalRatingC: 90 }),
      run({ id: 'R3', from: 'BAT1', to: 'BDC', kind: 'ess_dc', lengthFt: 4 }),
      run({ id: 'R4', from: 'BDC', to: 'HYB1', kind: 'ess_dc', lengthFt: 6 }),
      run({ id: 'R5', from: 'HYB1', to: 'MSP', kind: 'inverter_output', lengthFt: 20 }),
      run({ id: 'R6', from: 'HYB1', to: 'BLP', kind: 'service_feeder', lengthFt: 12 }),
    ],
  },
}

/** (3) Off-grid cabin: two strings into a charge controller, a 48 V battery, a DC load and a stand-alone inverter. */
const offGrid: DesignDocumentInput = {
  schemaVersion: 1,
  systemKind: 'off_grid',
  project: project('Fernbrake cabin off-grid PV', 'CH-0103', 'Fernbrake Trust', '3 Fernbrake Track', 'one_two_family_dwelling'),
  codeBasis: CEDAR_HOLLOW_BASIS,
  equipment: {
    modules: [MODULE_400],
    chargeControllers: [{ id: 'CC1', name: 'Generic 150 V / 80 A MPPT charge controller', maxPvVocV: 150, maxPvCurrentA: 40, batteryVoltageV: 48, maxOutputCurrentA: 80 }],
    batteries: [{ id: 'BAT1', name: 'Generic 10 kWh LFP battery, 51.2 V', nominalVoltageV: 51.2, maxContinuousDischargeA: 100, maxContinuousChargeA: 80, capacityKwh: 10.2, integralDisconnect: true }],
    inverters: [{ id: 'SAI1', name: 'Generic 3 kW stand-alone inverter', kind: 'stand_alone', pvInput: null, acVoltageV: 120, phases: 1, maxContinuousOutputA: 25, ratedPowerW: 3000 }],
    dcLoads: [{ id: 'PUMP', name: 'Well pump controller, 48 V', voltageV: 48, currentA: 10 }],
    panels: [{ id: 'LP', name: 'Cabin loads panel', role: 'ac_loads', busbarA: 100, mainBreakerA: 30, voltageV: 120, phases: 1, feed: 'end' }],
  },
  interconnection: null,
  topology: {
    arrays: [{ id: 'A1', name: 'Ground rack by the shed', mount: 'ground', moduleId: 'MOD400', moduleCount: 6, tiltDeg: 40, azimuthDeg: 180 }],
    strings: [
      { id: 'S1', arrayId: 'A1', modulesInSeries: 3, chargeControllerId: 'CC1' },
      { id: 'S2', arrayId: 'A1', modulesInSeries: 3, chargeControllerId: 'CC1' },
    ],
    runs: [
      run({ id: 'R1', from: 'S1', to: 'CC1', kind: 'pv_source', lengthFt: 40, racewayId: 'C1', method: 'PVC40', currentCarryingConductors: 4 }),
      run({ id: 'R2', from: 'S2', to: 'CC1', kind: 'pv_source', lengthFt: 40, racewayId: 'C1', method: 'PVC40', currentCarryingConductors: 4 }),
      run({ id: 'R3', from: 'CC1', to: 'BAT1', kind: 'charge_controller_output', lengthFt: 5 }),
      run({ id: 'R4', from: 'BAT1', to: 'SAI1', kind: 'ess_dc', lengthFt: 5 }),
      run({ id: 'R5', from: 'BAT1', to: 'PUMP', kind: 'dc_load', lengthFt: 30, method: 'PVC40' }),
      run({ id: 'R6', from: 'SAI1', to: 'LP', kind: 'inverter_output', lengthFt: 15, circuitConductors: 2 }),
    ],
  },
}

/** Microinverter job: two branches of eight one-module microinverters through an AC combiner. */
const microinverter: DesignDocumentInput = {
  schemaVersion: 1,
  systemKind: 'grid_tied',
  project: project('Tamsin residence PV', 'CH-0104', 'Ira Tamsin', '22 Wicket Hill', 'one_two_family_dwelling'),
  codeBasis: CEDAR_HOLLOW_BASIS,
  equipment: {
    modules: [MODULE_400],
    inverters: [{
      id: 'MIC', name: 'Generic 290 VA microinverter', kind: 'microinverter',
      pvInput: { maxDcVoltageV: 60, mpptMinV: 16, mpptMaxV: 48, startVoltageV: 22, mpptCount: 1, maxInputCurrentPerMpptA: 14, maxShortCircuitCurrentPerMpptA: 20 },
      acVoltageV: 240, phases: 1, maxContinuousOutputA: 1.21, ratedPowerW: 290, modulesPerUnit: 1, maxUnitsPerBranch: 13,
    }],
    combiners: [{ id: 'ACC', name: 'AC combiner panel', current: 'ac', maxVoltageV: 240, ratingA: 125, inputs: 4 }],
    panels: [servicePanel(225, 200)],
  },
  interconnection: { method: 'load_side_breaker', panelId: 'MSP', breakerPosition: 'busbar_end' },
  topology: {
    arrays: [{ id: 'A1', name: 'East and south roof', mount: 'roof', moduleId: 'MOD400', moduleCount: 16, tiltDeg: 30, azimuthDeg: 160 }],
    microBranches: [
      { id: 'B1', arrayId: 'A1', inverterId: 'MIC', units: 8 },
      { id: 'B2', arrayId: 'A1', inverterId: 'MIC', units: 8 },
    ],
    runs: [
      run({ id: 'R1', from: 'B1', to: 'ACC', kind: 'microinverter_branch', lengthFt: 70, racewayId: 'C1', rooftopHeightIn: 1, currentCarryingConductors: 4, circuitConductors: 2 }),
      run({ id: 'R2', from: 'B2', to: 'ACC', kind: 'microinverter_branch', lengthFt: 70, racewayId: 'C1', rooftopHeightIn: 1, currentCarryingConductors: 4, circuitConductors: 2 }),
      run({ id: 'R3', from: 'ACC', to: 'MSP', kind: 'ac_combiner_output', lengthFt: 10 }),
    ],
  },
}

/**
 * (4) Ground-mount farm: strings of twenty 1500 V modules, one twelve-input DC combiner per 100 kW
 * three-phase inverter, an AC combiner panel and a 480 V to 12.47 kV step-up transformer.
 * @param inverters number of 100 kW inverters (12 strings each)
 */
function groundMountFarm(inverters: number, name: string, code: string): DesignDocumentInput {
  const stringsPerInverter = 12
  const modulesPerString = 20
  const inverterIds = Array.from({ length: inverters }, (_, i) => `INV${i + 1}`)
  const strings: StringInput[] = inverterIds.flatMap((inv, i) =>
    Array.from({ length: stringsPerInverter }, (_, k) => ({
      id: `S${i + 1}.${k + 1}`, arrayId: `ROW${i + 1}`, modulesInSeries: modulesPerString, inverterId: inv, mppt: 1, combinerId: `CB${i + 1}`,
    })),
  )
  const pvRun = { material: 'Cu', insulation: 'PV', method: 'FREE_AIR', rooftopHeightIn: null, currentCarryingConductors: 2, terminalRatingC: 90 } as const
  const kvaPerInverter = 100
  // common practice, no source: usual three-phase pad-mount ratings [kVA]
  const padMountKva = [300, 500, 750, 1000, 1500, 2000, 2500, 3000]
  const transformerKva = padMountKva.find((kva) => kva >= inverters * kvaPerInverter) ?? inverters * kvaPerInverter
  return {
    schemaVersion: 1,
    systemKind: 'ground_mount_farm',
    project: project(name, code, 'Hollow Creek Community Solar LLC', 'Parcel 9, Sorrel Flats Road', 'other'),
    codeBasis: { ...CEDAR_HOLLOW_BASIS, designHighC: 35, cellTemperatureRiseC: 30 },
    equipment: {
      modules: [MODULE_420_UTILITY],
      inverters: inverterIds.map((id) => ({
        id, name: 'Generic 100 kW three-phase string inverter', kind: 'central' as const,
        pvInput: { maxDcVoltageV: 1500, mpptMinV: 500, mpptMaxV: 1300, startVoltageV: 550, mpptCount: 1, maxInputCurrentPerMpptA: 180, maxShortCircuitCurrentPerMpptA: 200 },
        acVoltageV: 480, phases: 3 as const, maxContinuousOutputA: 120.3, ratedPowerW: kvaPerInverter * 1000,
      })),
      combiners: [
        ...inverterIds.map((_, i) => ({ id: `CB${i + 1}`, name: 'Twelve-input fused DC combiner, 1500 V', current: 'dc' as const, maxVoltageV: 1500, ratingA: 250, inputs: 12 })),
        { id: 'ACP', name: 'AC combiner panel, 480 V', current: 'ac' as const, maxVoltageV: 600, ratingA: 2000, inputs: Math.max(12, inverters) },
      ],
      transformers: [{ id: 'XFMR', name: `Generic ${transformerKva} kVA pad-mount step-up transformer`, kva: transformerKva, primaryVoltageV: 480, secondaryVoltageV: 12470, phases: 3 }],
      pointsOfInterconnection: [{ id: 'POI', name: 'Hollow Creek 12.47 kV line, pole 41', voltageV: 12470, phases: 3 }],
    },
    interconnection: { method: 'supply_side', pointId: 'POI', serviceRatingA: 200 },
    topology: {
      arrays: inverterIds.map((_, i) => ({
        id: `ROW${i + 1}`, name: `Ground row ${i + 1}`, mount: 'ground' as const, moduleId: 'MOD420',
        moduleCount: stringsPerInverter * modulesPerString, tiltDeg: 25, azimuthDeg: 180,
      })),
      strings,
      runs: [
        ...strings.map((s, k) => ({ ...pvRun, id: `RS${s.id.slice(1)}`, from: s.id, to: s.combinerId!, kind: 'pv_source' as const, lengthFt: 40 + (k % stringsPerInverter) * 15 })),
        ...inverterIds.flatMap((inv, i) => [
          run({ id: `RC${i + 1}`, from: `CB${i + 1}`, to: inv, kind: 'pv_output', lengthFt: 120, method: 'PVC40', insulation: 'XHHW-2', material: 'Al', terminalRatingC: 90 }),
          run({ id: `RI${i + 1}`, from: inv, to: 'ACP', kind: 'inverter_output', lengthFt: 60 + i * 25, method: 'PVC40', material: 'Al', insulation: 'XHHW-2', currentCarryingConductors: 3, circuitConductors: 3 }),
        ]),
        run({ id: 'RT1', from: 'ACP', to: 'XFMR', kind: 'transformer_primary', lengthFt: 40, method: 'PVC40', currentCarryingConductors: 3, circuitConductors: 4 }),
        run({ id: 'RT2', from: 'XFMR', to: 'POI', kind: 'transformer_secondary', lengthFt: 300, method: 'PVC40', currentCarryingConductors: 3, circuitConductors: 3 }),
      ],
    },
  }
}

/** The demo designs by key. */
export const DEMO_DESIGN_INPUTS = {
  gridTied,
  gridTiedStorage,
  offGrid,
  microinverter,
  groundMountFarm: groundMountFarm(3, 'Sorrel Flats 300 kW community solar', 'CH-0105'),
  farm1MW: groundMountFarm(10, 'Sorrel Flats 1 MW community solar', 'CH-0106'),
} as const satisfies Record<string, DesignDocumentInput>

export type DemoDesignKey = keyof typeof DEMO_DESIGN_INPUTS

/** A demo design parsed and defaulted. The demo data is ours: failing to parse is a bug here. */
export function demoDesign(key: DemoDesignKey): DesignDocument {
  const parsed = parseDesign(DEMO_DESIGN_INPUTS[key])
  if (!parsed.ok) throw new Error(`demo design ${key} is invalid: ${parsed.issues.map((i) => `${i.field}: ${i.message}`).join('; ')}`)
  return parsed.value
}
