import { describe, expect, it } from 'vitest'
import { parseDesign } from '@shared/schemas/design'
import type { EquipmentItemDto, JurisdictionDto, ProjectDto } from '@/api/types'
import { applyStringingLayout } from './applyStringing'
import { starterDesign } from './starterDesign'
import { stringingLayouts } from '@shared/electrical/rules/stringing'

// invented demo scenario: a garage roof in the town of Brackenridge
const project = {
  id: 'p1', code: 'BR-0007', name: 'Tansy Row garage PV', customerName: 'Alba Wrenfield', customerEmail: null, customerPhone: null,
  siteAddress: '22 Tansy Row', siteCity: 'Brackenridge', jurisdiction: { id: 'j1', name: 'Brackenridge Building Office' }, utility: null,
  systemKind: 'grid_tied', status: 'draft', designer: null, reviewer: null, coordinator: null, targetSubmissionDate: null, design: null,
  archivedAt: null, createdAt: '2026-12-01T00:00:00.000Z', updatedAt: '2026-12-01T00:00:00.000Z', version: 1,
} satisfies ProjectDto
const jurisdiction = { id: 'j1', name: 'Brackenridge Building Office', necEdition: 2020, designLowC: -21, designHighC: 33 } as JurisdictionDto
const item = (kind: EquipmentItemDto['kind'], model: string, spec: Record<string, unknown>) =>
  ({ id: model, kind, manufacturer: 'Generic', model, notes: '', spec, warnings: [], datasheet: null, createdAt: '', updatedAt: '', version: 1 }) as unknown as EquipmentItemDto

const module = item('module', '410 W module', {
  pmaxW: 410, vocV: 37.4, vmpV: 31.4, iscA: 13.9, impA: 13.06, vocCoefficient: { value: -0.26, unit: '%/°C' }, vmpCoefficient: null,
  pmaxCoefficient: { value: -0.34, unit: '%/°C' }, iscCoefficient: { value: 0.05, unit: '%/°C' }, cells: 108, technology: 'crystalline',
  maxSeriesFuseA: 25, maxSystemVoltageV: 1000, lengthMm: 1722, widthMm: 1134,
})
const inverter = item('inverter', '7.6 kW inverter', {
  kind: 'string', acVoltageV: 240, phases: 1, maxContinuousOutputA: 32, ratedPowerW: 7600, backupOutputA: null, modulesPerUnit: null, maxUnitsPerBranch: null,
  pvInput: { maxDcVoltageV: 600, mpptMinV: 100, mpptMaxV: 480, startVoltageV: 120, mpptCount: 2, maxInputCurrentPerMpptA: 15, maxShortCircuitCurrentPerMpptA: 20 },
})

describe('first design from the library', () => {
  const start = () => starterDesign(project, jurisdiction, 'Kestrel Fen Solar Co-op', { module, others: [inverter], moduleCount: 20, busbarA: 200, mainBreakerA: 200 })

  it('takes the code basis from the jurisdiction profile and copies the library items', () => {
    const doc = start()
    expect(doc.codeBasis).toMatchObject({ necEdition: 2020, designLowC: -21, designHighC: 33 })
    expect(doc.equipment.modules.map((m) => [m.id, m.name])).toEqual([['MOD1', 'Generic 410 W module']])
    expect(doc.equipment.inverters[0]?.pvInput?.mpptCount).toBe(2)
    expect(doc.interconnection).toMatchObject({ method: 'load_side_breaker', panelId: 'MSP' })
  })

  it('leaves the strings to the designer, and is whole once a layout is applied', () => {
    const doc = start()
    const unstrung = parseDesign(doc)
    expect(unstrung.ok ? [] : unstrung.issues.map((i) => i.field)).toEqual(['topology.arrays[0].moduleCount'])
    const layouts = stringingLayouts({
      edition: 2020, module: doc.equipment.modules[0]!, inverter: { pvInput: doc.equipment.inverters[0]!.pvInput!, ratedPowerW: 7600 },
      moduleCount: 20, designLowC: -21, designHighC: 33, cellTemperatureRiseC: 25, dwelling: true,
    })
    if (!layouts.ok) throw new Error('no layouts')
    applyStringingLayout(doc, 'A1', 'INV1', layouts.value[0]!)
    expect(doc.topology.strings.map((s) => [s.modulesInSeries, s.mppt])).toEqual([[10, 1], [10, 2]])
    expect(parseDesign(doc).ok).toBe(true)
  })
})
