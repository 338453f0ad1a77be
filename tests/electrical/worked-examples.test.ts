/**
 * Worked examples: one system of each kind plus microinverter branches, each built here by hand
 * and checked step by step against numbers worked out on paper from the NEC tables. Ambient 30 °C
 * keeps every temperature correction at 1.00 and two current-carrying conductors keep adjustment
 * at 1.00, so each conductor is read straight from the 75 °C column of Table 310.16.
 * Table values are NFPA 70-2020 (values from memory):
 *   Table 310.16 Cu 75 °C: 14 AWG 20 A, 12 AWG 25 A, 10 AWG 35 A, 8 AWG 50 A, 6 AWG 65 A,
 *     4 AWG 85 A, 2 AWG 115 A, 1 AWG 130 A, 4/0 AWG 230 A
 *   240.4(D): 14 AWG Cu ≤ 15 A, 12 AWG ≤ 20 A, 10 AWG ≤ 30 A
 *   Table 250.122 Cu: 15 A → 14, 20 A → 12, 60 A → 10, 100 A → 8, 200 A → 6, 400 A → 3
 *   Chapter 9 Table 8 Cu: 14 AWG 3.14 Ω/kft, 12 AWG 1.98 Ω/kft, 10 AWG 1.24 Ω/kft
 *   Table 690.7(A): −6 to −10 °C → 1.14
 */
import { describe, expect, it } from 'vitest'
import { evaluateDocument, type Evaluation } from '../../shared/electrical/evaluate'
import type { DesignDocumentInput } from '../../shared/schemas/design'

type RunInput = NonNullable<DesignDocumentInput['topology']['runs']>[number]
type ModuleInput = DesignDocumentInput['equipment']['modules'][number]

const basis = { necEdition: 2020, designLowC: -10, designHighC: 30, cellTemperatureRiseC: 20 } as const
const project = (occupancy: 'one_two_family_dwelling' | 'other') => ({
  name: 'Worked example', code: 'WX-1', owner: 'Example owner', installer: 'Larkspur Valley Solar Co.', siteAddress: '1 Example Row',
  city: 'Cedar Hollow', jurisdiction: 'Cedar Hollow Building Department', utility: 'Hollow Creek Electric Cooperative', occupancy,
})
const run = (id: string, from: string, to: string, kind: RunInput['kind'], lengthFt = 20): RunInput => ({
  id, from, to, kind, lengthFt, material: 'Cu', insulation: 'THWN-2', method: 'EMT', rooftopHeightIn: null, currentCarryingConductors: 2, terminalRatingC: 75,
})
const module350: ModuleInput = {
  id: 'M350', name: 'Generic 350 W module', pmaxW: 350, vocV: 40, vmpV: 33, iscA: 11, impA: 10.6,
  vocCoefficient: { value: -0.3, unit: '%/°C' }, pmaxCoefficient: { value: -0.4, unit: '%/°C' }, iscCoefficient: { value: 0.05, unit: '%/°C' },
  cells: 120, maxSeriesFuseA: 20, maxSystemVoltageV: 1000,
}
const pvInput = { maxDcVoltageV: 600, mpptMinV: 90, mpptMaxV: 500, startVoltageV: 100, mpptCount: 1, maxInputCurrentPerMpptA: 13, maxShortCircuitCurrentPerMpptA: 18 }
const panel = (id: string, busbarA: number, mainBreakerA: number) => ({ id, name: 'Service panel', role: 'service' as const, busbarA, mainBreakerA, voltageV: 240, phases: 1 as const, feed: 'end' as const })

function evaluated(doc: DesignDocumentInput): Evaluation {
  const ev = evaluateDocument(doc)
  if (!ev.valid) throw new Error(JSON.stringify(ev.issues))
  return ev
}
const value = (ev: Evaluation, key: string) => {
  const d = ev.sections.flatMap((s) => s.items).find((x) => x.key === key)
  if (!d) throw new Error(`no result ${key}`)
  return d
}
const runOf = (ev: Evaluation, id: string) => ev.runs.find((r) => r.id === id)!

describe('worked example 1: grid-tied string inverter', () => {
  const doc: DesignDocumentInput = {
    schemaVersion: 1, systemKind: 'grid_tied', project: project('one_two_family_dwelling'), codeBasis: basis,
    equipment: {
      modules: [module350],
      inverters: [{ id: 'INV', name: 'Generic 5 kW inverter', kind: 'string', pvInput, acVoltageV: 240, phases: 1, maxContinuousOutputA: 21, ratedPowerW: 5000 }],
      panels: [panel('MSP', 200, 200)],
    },
    interconnection: { method: 'load_side_breaker', panelId: 'MSP', breakerPosition: 'end_opposite_main' },
    topology: {
      arrays: [{ id: 'A', name: 'Roof', mount: 'roof', moduleId: 'M350', moduleCount: 12, tiltDeg: 20, azimuthDeg: 180 }],
      strings: [{ id: 'S1', arrayId: 'A', modulesInSeries: 12, inverterId: 'INV', mppt: 1 }],
      runs: [run('R1', 'S1', 'INV', 'pv_source', 30), run('R2', 'INV', 'MSP', 'inverter_output')],
    },
  }
  const ev = evaluated(doc)

  it('step 1, 690.7(A)(1): 12 × 40 V × (1 + 0.003 × 35) = 530.4 V ≤ 600 V', () => {
    expect(value(ev, 'string.S1.vocMax').value).toBeCloseTo(530.4, 6)
    expect(value(ev, 'string.S1.dwellingLimit').status).toBe('pass')
  })
  it('step 2, hot day: cell 30 + 20 = 50 °C, 12 × 33 V × (1 − 0.004 × 25) = 356.4 V ≥ 100 V start', () => {
    expect(value(ev, 'string.S1.vmpHot').value).toBeCloseTo(356.4, 6)
    expect(value(ev, 'string.S1.startVoltage').status).toBe('pass')
  })
  it('step 3, 690.8(A): 1.25 × 11 A = 13.75 A; the 20 A device 690.9(B) implies rules out 14 AWG (240.4(D)) → 12 AWG', () => {
    expect(runOf(ev, 'R1')).toMatchObject({ maxCurrentA: 13.75, size: '12', ocpdA: null })
  })
  it('step 4, inverter output: 1.25 × 21 A = 26.25 A → 30 A breaker, 10 AWG (35 A), 10 AWG EGC', () => {
    expect(runOf(ev, 'R2')).toMatchObject({ maxCurrentA: 21, size: '10', ocpdA: 30, egcSize: '10' })
  })
  it('step 5, 705.12(B)(3)(2): 1.25 × 21 + 200 = 226.25 A ≤ 240 A', () => {
    expect(value(ev, 'interconnection.busbar120').value).toBeCloseTo(226.25, 9)
    expect(value(ev, 'interconnection.busbar120').status).toBe('pass')
    expect(value(ev, 'interconnection.busbar120').reference).toBe('NEC 2020 705.12(B)(3)(2)')
  })
})

describe('worked example 2: hybrid inverter with battery and backup loads', () => {
  const doc: DesignDocumentInput = {
    schemaVersion: 1, systemKind: 'grid_tied_storage', project: project('one_two_family_dwelling'), codeBasis: basis,
    equipment: {
      modules: [module350],
      inverters: [{ id: 'HYB', name: 'Generic 5 kW hybrid', kind: 'hybrid', pvInput, acVoltageV: 240, phases: 1, maxContinuousOutputA: 21, ratedPowerW: 5000, backupOutputA: 25 }],
      batteries: [{ id: 'BAT', name: 'Generic 51.2 V battery', nominalVoltageV: 51.2, maxContinuousDischargeA: 100, maxContinuousChargeA: 80, capacityKwh: 10 }],
      disconnects: [{ id: 'BD', name: 'Battery disconnect', current: 'dc', ratingA: 125, voltageRatingV: 80 }],
      panels: [panel('MSP', 200, 150), { ...panel('BLP', 100, 60), role: 'backup_loads' }],
    },
    interconnection: { method: 'load_side_breaker', panelId: 'MSP', breakerPosition: 'busbar_end' },
    topology: {
      arrays: [{ id: 'A', name: 'Roof', mount: 'roof', moduleId: 'M350', moduleCount: 12, tiltDeg: 20, azimuthDeg: 180 }],
      strings: [{ id: 'S1', arrayId: 'A', modulesInSeries: 12, inverterId: 'HYB', mppt: 1 }],
      runs: [
        run('R1', 'S1', 'HYB', 'pv_source', 30), run('R2', 'BAT', 'BD', 'ess_dc', 5), run('R3', 'BD', 'HYB', 'ess_dc', 5),
        run('R4', 'HYB', 'MSP', 'inverter_output'), run('R5', 'HYB', 'BLP', 'service_feeder'),
      ],
    },
  }
  const ev = evaluated(doc)

  it('step 1, 706.30(A): 100 A discharge; 1.25 × 100 = 125 A → 125 A device, 1 AWG (130 A), 6 AWG EGC', () => {
    expect(runOf(ev, 'R2')).toMatchObject({ maxCurrentA: 100, size: '1', ocpdA: 125, egcSize: '6' })
    expect(runOf(ev, 'R3').maxCurrentA).toBe(100)
  })
  it('step 2, 706.15: the disconnect BD serves the battery', () => {
    expect(value(ev, 'equipment.BAT.disconnect').status).toBe('pass')
    expect(value(ev, 'equipment.BD.current').status).toBe('pass')
  })
  it('step 3, backup feeder: 1.25 × 25 = 31.25 A → 35 A; 10 AWG is held to 30 A by 240.4(D) → 8 AWG', () => {
    expect(runOf(ev, 'R5')).toMatchObject({ maxCurrentA: 25, ocpdA: 35, size: '8', egcSize: '10' })
  })
  it('step 4, 705.12(B)(3)(1): 1.25 × 21 + 150 = 176.25 A ≤ 200 A, the 100 % rule passes anywhere on the busbar', () => {
    expect(value(ev, 'interconnection.busbar100').status).toBe('pass')
  })
})

describe('worked example 3: off-grid with charge controller, battery and DC load', () => {
  const module100: ModuleInput = {
    id: 'M100', name: 'Generic 100 W 36-cell module', pmaxW: 100, vocV: 22, vmpV: 18, iscA: 6, impA: 5.56, vocCoefficient: null,
    pmaxCoefficient: { value: -0.45, unit: '%/°C' }, iscCoefficient: { value: 0.05, unit: '%/°C' }, cells: 36, maxSeriesFuseA: 15, maxSystemVoltageV: 600,
  }
  const doc: DesignDocumentInput = {
    schemaVersion: 1, systemKind: 'off_grid', project: project('one_two_family_dwelling'), codeBasis: basis,
    equipment: {
      modules: [module100],
      chargeControllers: [{ id: 'CC', name: 'Generic 100 V / 30 A controller', maxPvVocV: 100, maxPvCurrentA: 20, batteryVoltageV: 24, maxOutputCurrentA: 30 }],
      batteries: [{ id: 'BAT', name: 'Generic 25.6 V battery', nominalVoltageV: 25.6, maxContinuousDischargeA: 100, maxContinuousChargeA: 30, capacityKwh: 5, integralDisconnect: true }],
      inverters: [{ id: 'SAI', name: 'Generic 2 kW stand-alone inverter', kind: 'stand_alone', pvInput: null, acVoltageV: 120, phases: 1, maxContinuousOutputA: 16.7, ratedPowerW: 2000 }],
      dcLoads: [{ id: 'LOAD', name: 'DC lighting', voltageV: 24, currentA: 12 }],
      panels: [{ ...panel('LP', 100, 30), role: 'ac_loads', voltageV: 120 }],
    },
    interconnection: null,
    topology: {
      arrays: [{ id: 'A', name: 'Rack', mount: 'ground', moduleId: 'M100', moduleCount: 4, tiltDeg: 45, azimuthDeg: 180 }],
      strings: [{ id: 'S1', arrayId: 'A', modulesInSeries: 2, chargeControllerId: 'CC' }, { id: 'S2', arrayId: 'A', modulesInSeries: 2, chargeControllerId: 'CC' }],
      runs: [
        run('R1', 'S1', 'CC', 'pv_source'), run('R2', 'S2', 'CC', 'pv_source'), run('R3', 'CC', 'BAT', 'charge_controller_output', 5),
        run('R4', 'BAT', 'SAI', 'ess_dc', 5), run('R5', 'BAT', 'LOAD', 'dc_load', 20), run('R6', 'SAI', 'LP', 'inverter_output', 10),
      ],
    },
  }
  const ev = evaluated(doc)

  it('step 1, Table 690.7(A): 2 × 22 V × 1.14 = 50.16 V ≤ 100 V controller limit', () => {
    expect(value(ev, 'string.S1.vocMax').value).toBeCloseTo(50.16, 9)
    expect(value(ev, 'string.S1.controllerLimit').status).toBe('pass')
  })
  it('step 2, 690.8(A): 2 × 1.25 × 6 A = 15 A ≤ 20 A controller input', () => {
    expect(value(ev, 'input.CC.maxCurrent').value).toBe(15)
    expect(value(ev, 'input.CC.controllerCurrent').status).toBe('pass')
  })
  it('step 3, controller output 30 A: 37.5 A → 40 A device, 8 AWG (10 AWG 35 A is short)', () => {
    expect(runOf(ev, 'R3')).toMatchObject({ maxCurrentA: 30, ocpdA: 40, size: '8' })
  })
  it('step 4, DC load 12 A at 24 V over 20 ft: 14 AWG carries it but drops 6.28 %; 12 AWG 3.96 %; 10 AWG 2.48 % ≤ 3 %', () => {
    // 2 × 20 ft × 12 A × 3.14 Ω/kft = 1.507 V = 6.28 % of 24 V; × 1.98 → 3.96 %; × 1.24 → 2.48 %
    const r5 = runOf(ev, 'R5')
    expect(r5).toMatchObject({ sizeForAmpacity: '14', size: '10', ocpdA: 15 })
    expect(r5.voltageDropPercent).toBeCloseTo(2.48, 2)
    // 250.122(B): EGC grows with the circuit conductors, 14 AWG × 10380 / 4110 cmil → 10 AWG
    expect(r5.egcSize).toBe('10')
  })
})

describe('worked example 4: ground-mount farm with combiners, three-phase inverters and a step-up transformer', () => {
  const module450: ModuleInput = {
    id: 'M450', name: 'Generic 450 W module, 1500 V', pmaxW: 450, vocV: 50, vmpV: 42, iscA: 11.4, impA: 10.7,
    vocCoefficient: { value: -0.28, unit: '%/°C' }, pmaxCoefficient: { value: -0.36, unit: '%/°C' }, iscCoefficient: { value: 0.05, unit: '%/°C' },
    cells: 144, maxSeriesFuseA: 20, maxSystemVoltageV: 1500,
  }
  const inverter = (id: string) => ({
    id, name: 'Generic 50 kW inverter', kind: 'central' as const, acVoltageV: 480, phases: 3 as const, maxContinuousOutputA: 60.1, ratedPowerW: 50000,
    pvInput: { maxDcVoltageV: 1500, mpptMinV: 600, mpptMaxV: 1300, startVoltageV: 650, mpptCount: 1, maxInputCurrentPerMpptA: 40, maxShortCircuitCurrentPerMpptA: 60 },
  })
  const strings = ['1', '2'].flatMap((i) => ['1', '2', '3'].map((k) => ({ id: `S${i}${k}`, arrayId: `ROW${i}`, modulesInSeries: 24, inverterId: `INV${i}`, mppt: 1, combinerId: `CB${i}` })))
  const doc: DesignDocumentInput = {
    schemaVersion: 1, systemKind: 'ground_mount_farm', project: project('other'), codeBasis: basis,
    equipment: {
      modules: [module450],
      inverters: [inverter('INV1'), inverter('INV2')],
      combiners: [
        { id: 'CB1', name: 'DC combiner', current: 'dc', maxVoltageV: 1500, ratingA: 100, inputs: 4 },
        { id: 'CB2', name: 'DC combiner', current: 'dc', maxVoltageV: 1500, ratingA: 100, inputs: 4 },
        { id: 'ACP', name: 'AC combiner panel', current: 'ac', maxVoltageV: 600, ratingA: 400, inputs: 4 },
      ],
      transformers: [{ id: 'XF', name: 'Generic 150 kVA step-up', kva: 150, primaryVoltageV: 480, secondaryVoltageV: 12470, phases: 3 }],
      pointsOfInterconnection: [{ id: 'POI', name: 'Utility line', voltageV: 12470, phases: 3 }],
    },
    interconnection: { method: 'supply_side', pointId: 'POI', serviceRatingA: 100 },
    topology: {
      arrays: [1, 2].map((i) => ({ id: `ROW${i}`, name: `Row ${i}`, mount: 'ground' as const, moduleId: 'M450', moduleCount: 72, tiltDeg: 25, azimuthDeg: 180 })),
      strings,
      runs: [
        ...strings.map((s) => run(`R${s.id}`, s.id, s.combinerId, 'pv_source', 60)),
        run('RC1', 'CB1', 'INV1', 'pv_output', 100), run('RC2', 'CB2', 'INV2', 'pv_output', 100),
        run('RI1', 'INV1', 'ACP', 'inverter_output', 50), run('RI2', 'INV2', 'ACP', 'inverter_output', 50),
        { ...run('RT', 'ACP', 'XF', 'transformer_primary', 30), currentCarryingConductors: 3 },
        { ...run('RX', 'XF', 'POI', 'transformer_secondary', 100), currentCarryingConductors: 3 },
      ],
    },
  }
  const ev = evaluated(doc)

  it('step 1, 690.7(A)(1): 24 × 50 V × (1 + 0.0028 × 35) = 1317.6 V ≤ 1500 V', () => {
    expect(value(ev, 'string.S11.vocMax').value).toBeCloseTo(1317.6, 6)
    expect(value(ev, 'string.S11.inverterLimit').status).toBe('pass')
  })
  it('step 2, 690.9(A): (3 − 1) × 1.25 × 11.4 = 28.5 A > 20 A series fuse, so each string is fused: 1.25 × 14.25 = 17.8 → 20 A', () => {
    expect(value(ev, 'input.INV1.mppt1.ocpdRequired').value).toBe(true)
    expect(runOf(ev, 'RS11').ocpdA).toBe(20)
    expect(value(ev, 'run.RS11.seriesFuse').status).toBe('pass')
  })
  it('step 3, 690.8(A) output circuit: 3 × 14.25 = 42.75 A; 1.25 × 42.75 = 53.4 A → 60 A, 6 AWG (65 A)', () => {
    expect(runOf(ev, 'RC1')).toMatchObject({ ocpdA: 60, size: '6' })
    expect(runOf(ev, 'RC1').maxCurrentA).toBeCloseTo(42.75, 9)
  })
  it('step 4, inverter output 60.1 A: 75.1 A → 80 A, 4 AWG (85 A), 8 AWG EGC', () => {
    expect(runOf(ev, 'RI1')).toMatchObject({ maxCurrentA: 60.1, ocpdA: 80, size: '4', egcSize: '8' })
  })
  it('step 5, transformer primary 150 kVA / (√3 × 480 V) = 180.4 A: 225.5 A → 250 A, 4/0 AWG (230 A)', () => {
    expect(runOf(ev, 'RT').maxCurrentA).toBeCloseTo(180.42, 2)
    expect(runOf(ev, 'RT')).toMatchObject({ ocpdA: 250, size: '4/0' })
  })
  it('step 6, 12.47 kV side: Article 311 and Table 450.3(A) are left to an engineer; 705.11 at 6.9 A ≤ 100 A', () => {
    expect(value(ev, 'run.RX.mediumVoltage').status).toBe('warn')
    expect(value(ev, 'equipment.XF.ocpd.over1000V').status).toBe('warn')
    expect(value(ev, 'interconnection.supplySide').value).toBeCloseTo(6.945, 3)
    expect(value(ev, 'interconnection.supplySide').status).toBe('pass')
  })
})

describe('worked example 5: microinverter branch circuits', () => {
  const doc: DesignDocumentInput = {
    schemaVersion: 1, systemKind: 'grid_tied', project: project('one_two_family_dwelling'), codeBasis: basis,
    equipment: {
      modules: [module350],
      inverters: [{
        id: 'MI', name: 'Generic 240 VA microinverter', kind: 'microinverter', acVoltageV: 240, phases: 1, maxContinuousOutputA: 1, ratedPowerW: 240,
        pvInput: { maxDcVoltageV: 60, mpptMinV: 22, mpptMaxV: 48, startVoltageV: 24, mpptCount: 1, maxInputCurrentPerMpptA: 12, maxShortCircuitCurrentPerMpptA: 15 },
        modulesPerUnit: 1, maxUnitsPerBranch: 16,
      }],
      panels: [panel('MSP', 100, 100)],
    },
    interconnection: { method: 'load_side_breaker', panelId: 'MSP', breakerPosition: 'end_opposite_main' },
    topology: {
      arrays: [{ id: 'A', name: 'Roof', mount: 'roof', moduleId: 'M350', moduleCount: 10, tiltDeg: 20, azimuthDeg: 180 }],
      microBranches: [{ id: 'B1', arrayId: 'A', inverterId: 'MI', units: 10 }],
      runs: [run('R1', 'B1', 'MSP', 'microinverter_branch', 40)],
    },
  }
  const ev = evaluated(doc)

  it('step 1, per module: 40 V × 1.105 = 44.2 V ≤ 60 V; hot Vmp 33 V × 0.9 = 29.7 V ≥ 24 V start', () => {
    expect(value(ev, 'branch.B1.moduleVocMax').value).toBeCloseTo(44.2, 9)
    expect(value(ev, 'branch.B1.vmpHot').value).toBeCloseTo(29.7, 9)
    expect(value(ev, 'branch.B1.startVoltage').status).toBe('pass')
    expect(value(ev, 'branch.B1.units').status).toBe('pass')
  })
  it('step 2, 690.8(A): 10 × 1 A = 10 A; 12.5 A → 15 A breaker, 14 AWG', () => {
    expect(runOf(ev, 'R1')).toMatchObject({ maxCurrentA: 10, ocpdA: 15, size: '14' })
  })
  it('step 3, 705.12(B)(3): 12.5 + 100 = 112.5 A > 100 A busbar, ≤ 120 A with the breaker at the far end', () => {
    expect(value(ev, 'interconnection.busbar100').status).toBe('info')
    expect(value(ev, 'interconnection.busbar120').status).toBe('pass')
  })
})
