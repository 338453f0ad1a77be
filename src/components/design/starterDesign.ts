import {
  codeBasisSchema,
  DESIGN_SCHEMA_VERSION,
  equipmentSchema,
  interconnectionSchema,
  projectSchema,
  topologySchema,
  type DesignDocument,
  type SystemKind,
} from '@shared/schemas/design'
import { toDesignEquipment } from '@shared/schemas/equipment'
import type { EquipmentItemDto, EquipmentKind, JurisdictionDto, ProjectDto } from '@/api/types'

/** Library kinds a first design of each system kind starts from, beyond the module. */
export const STARTER_KINDS: Record<SystemKind, { kinds: EquipmentKind[]; label: string }[]> = {
  grid_tied: [{ kinds: ['inverter', 'microinverter'], label: 'Inverter or microinverter' }],
  grid_tied_storage: [{ kinds: ['inverter'], label: 'Hybrid inverter' }, { kinds: ['battery'], label: 'Battery' }],
  off_grid: [{ kinds: ['charge_controller'], label: 'Charge controller' }, { kinds: ['battery'], label: 'Battery' }, { kinds: ['inverter'], label: 'Stand-alone inverter' }],
  ground_mount_farm: [{ kinds: ['inverter'], label: 'Inverter' }, { kinds: ['transformer'], label: 'Step-up transformer' }],
}

export interface StarterChoice {
  module: EquipmentItemDto
  /** One item per entry of STARTER_KINDS for the project's system kind. */
  others: EquipmentItemDto[]
  moduleCount: number
  /** Service panel the system connects to (grid-tied kinds) [A]. */
  busbarA: number
  mainBreakerA: number
}

const ID_PREFIX: Record<EquipmentKind, string> = {
  module: 'MOD', inverter: 'INV', microinverter: 'MIC', optimizer: 'OPT', charge_controller: 'CC', battery: 'BAT',
  combiner: 'CB', disconnect: 'DISC', transformer: 'XF',
}

/**
 * The first design of a project: site and code basis from the project and its jurisdiction
 * profile, the chosen library equipment, one array of all the modules and, for grid-tied kinds,
 * the service panel with a load-side connection. Each part is parsed with its schema (defaults
 * filled, every field checked); what is still missing across parts, such as the strings, is what
 * the engine's issues list next in the editor.
 */
export function starterDesign(project: ProjectDto, jurisdiction: JurisdictionDto, organizationName: string, choice: StarterChoice): DesignDocument {
  const equipment: Record<string, unknown[]> = {}
  const idOf = new Map<EquipmentItemDto, string>()
  for (const item of [choice.module, ...choice.others]) {
    const { collection, entry } = toDesignEquipment(item, `${ID_PREFIX[item.kind]}1`)
    ;(equipment[collection] ??= []).push(entry)
    idOf.set(item, entry.id)
  }
  const grid = project.systemKind !== 'off_grid'
  if (grid) {
    const threePhase = project.systemKind === 'ground_mount_farm'
    equipment.panels = [{
      id: 'MSP', name: 'Main service panel', role: 'service', busbarA: choice.busbarA, mainBreakerA: choice.mainBreakerA,
      voltageV: threePhase ? 480 : 240, phases: threePhase ? 3 : 1, feed: 'end',
    }]
  }
  const micro = choice.others.find((item) => item.kind === 'microinverter')
  const modulesPerUnit = (micro && 'modulesPerUnit' in micro.spec ? micro.spec.modulesPerUnit : null) ?? 1
  return {
    schemaVersion: DESIGN_SCHEMA_VERSION,
    systemKind: project.systemKind,
    project: projectSchema.parse({
      name: project.name,
      code: project.code,
      owner: project.customerName,
      installer: organizationName,
      siteAddress: project.siteAddress,
      city: project.siteCity,
      jurisdiction: jurisdiction.name,
      utility: project.utility ?? 'Not named on the project',
      occupancy: project.systemKind === 'ground_mount_farm' ? 'other' : 'one_two_family_dwelling',
    }),
    codeBasis: codeBasisSchema.parse({ necEdition: jurisdiction.necEdition, designLowC: jurisdiction.designLowC, designHighC: jurisdiction.designHighC }),
    equipment: equipmentSchema.parse(equipment),
    interconnection: grid ? interconnectionSchema.parse({ method: 'load_side_breaker', panelId: 'MSP', breakerPosition: 'end_opposite_main' }) : null,
    topology: topologySchema.parse({
      arrays: [{
        id: 'A1', name: 'Array 1', mount: project.systemKind === 'ground_mount_farm' ? 'ground' : 'roof', moduleId: idOf.get(choice.module),
        // facing south at a moderate pitch until the designer enters the real face
        moduleCount: choice.moduleCount, tiltDeg: 20, azimuthDeg: 180,
      }],
      microBranches: micro ? [{ id: 'B1', arrayId: 'A1', inverterId: idOf.get(micro), units: Math.ceil(choice.moduleCount / modulesPerUnit) }] : [],
    }),
  }
}
