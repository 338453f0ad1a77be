import type { EntityManager } from 'typeorm'
import type { Role } from '../../shared/auth/roles'
import { demoDesign, type DemoDesignKey } from '../../shared/demo/designs'
import type { DesignDocument } from '../../shared/schemas/design'
import { EQUIPMENT_SPECS, type EquipmentItemBody, type EquipmentKind } from '../../shared/schemas/equipment'
import type { CreateJurisdictionBody } from '../../shared/schemas/jurisdiction'
import { DesignEntity, EquipmentItemEntity, JurisdictionProfileEntity, ProjectEntity, UserEntity } from '../entities'
import { indexedColumns } from '../services/design-service'

/**
 * The demo workspace of the invented installer: the invented Cedar Hollow Building Department,
 * a library of generic equipment taken from the demo designs, and one project per system kind
 * with its design. Invented data, for the demo only.
 */

export const DEMO_JURISDICTION_NAME = 'Cedar Hollow Building Department'

/** One demo project per system kind, keyed by the demo design it carries. */
export const DEMO_PROJECT_DESIGNS: readonly DemoDesignKey[] = ['gridTied', 'gridTiedStorage', 'offGrid', 'groundMountFarm']

/** Designs whose equipment fills the demo library (the microinverter job adds that kind). */
const LIBRARY_SOURCES: readonly DemoDesignKey[] = [...DEMO_PROJECT_DESIGNS, 'microinverter']

/** Outline of the demo modules [mm]; invented, in the range of 108- and 144-cell modules. */
const DEMO_MODULE_OUTLINE: Record<string, { lengthMm: number; widthMm: number }> = {
  MOD400: { lengthMm: 1722, widthMm: 1134 },
  MOD420: { lengthMm: 2108, widthMm: 1048 },
}

/** An invented module-level converter, so the library holds every kind. */
const DEMO_OPTIMIZER: EquipmentItemBody = {
  kind: 'optimizer',
  manufacturer: 'Generic',
  model: '450 W module-level DC optimiser',
  notes: 'Invented demo item',
  spec: { maxOutputVoltageV: 60, maxOutputCurrentA: 15, maxInputVoltageV: 80 },
}

function demoJurisdiction(basis: DesignDocument['codeBasis']): CreateJurisdictionBody {
  return {
    name: DEMO_JURISDICTION_NAME,
    necEdition: basis.necEdition,
    designLowC: basis.designLowC,
    designHighC: basis.designHighC,
    sheetSize: 'ANSI_B',
    requiredLabels: ['690.13(B)', '690.53', '690.56(C)', '705.10'],
    generalNotesTemplate: [
      '1. Work on {{project.name}} ({{project.code}}) at {{project.siteAddress}}, {{project.siteCity}}, is to meet NFPA 70, {{jurisdiction.necEdition}} edition, as adopted and amended by {{jurisdiction.name}}.',
      '2. Call for rough and final electrical inspections; keep the approved plan set on site.',
      '{{#if project.utility}}3. Do not energise before {{project.utility}} gives written permission to operate.{{/if}}',
    ].join('\n'),
    submissionMethod: 'portal',
    submissionContact: 'Permit desk, Cedar Hollow Building Department',
    submissionEmail: 'permits@cedar-hollow.example',
    submissionPhone: '555-0142',
    submissionUrl: 'https://permits.cedar-hollow.example/solar',
    submissionAddress: null,
    feeNotes: 'Invented demo schedule: residential PV flat permit fee plus plan review; commercial by valuation.',
  }
}

/** The equipment of a design as library items of the fitting kinds. */
function libraryItemsOf(doc: DesignDocument): EquipmentItemBody[] {
  const { modules, inverters, optimizers, chargeControllers, batteries, combiners, disconnects, transformers } = doc.equipment
  type Entry = [EquipmentKind, { id: string; name: string }]
  const as = (kind: EquipmentKind) => (entry: Entry[1]): Entry => [kind, entry]
  const entries: Entry[] = [
    ...modules.map((m) => as('module')({ ...m, ...DEMO_MODULE_OUTLINE[m.id] })),
    ...inverters.map((i) => as(i.kind === 'microinverter' ? 'microinverter' : 'inverter')(i)),
    ...optimizers.map(as('optimizer')),
    ...chargeControllers.map(as('charge_controller')),
    ...batteries.map(as('battery')),
    ...combiners.map(as('combiner')),
    ...disconnects.map(as('disconnect')),
    ...transformers.map(as('transformer')),
  ]
  return entries.map(([kind, { id, name, ...fields }]) => {
    const spec = EQUIPMENT_SPECS[kind].safeParse(fields)
    // the demo data is ours: a demo item that does not parse is a bug here
    if (!spec.success) throw new Error(`demo equipment ${id} (${kind}) is not a valid library item: ${spec.error.message}`)
    return { kind, manufacturer: 'Generic', model: name.replace(/^Generic /, ''), notes: 'Invented demo item', spec: spec.data } as EquipmentItemBody
  })
}

/** Every demo library item, once per kind and model. */
export function demoLibrary(): EquipmentItemBody[] {
  const byKey = new Map<string, EquipmentItemBody>()
  for (const item of [...LIBRARY_SOURCES.flatMap((key) => libraryItemsOf(demoDesign(key))), DEMO_OPTIMIZER]) {
    byKey.set(`${item.kind}:${item.model}`, item)
  }
  return [...byKey.values()]
}

/**
 * Loads the demo workspace into an organisation whose workspace is empty; once it holds any
 * jurisdiction profile or project (demo or the user's own), it is left alone.
 */
export async function loadDemoWorkspace(manager: EntityManager, organizationId: string): Promise<'created' | 'present'> {
  const jurisdictions = manager.getRepository(JurisdictionProfileEntity)
  const inUse = (await jurisdictions.existsBy({ organizationId })) || (await manager.getRepository(ProjectEntity).existsBy({ organizationId }))
  if (inUse) return 'present'
  const designs = DEMO_PROJECT_DESIGNS.map((key) => demoDesign(key))
  const jurisdiction = await jurisdictions.save({ organizationId, ...demoJurisdiction(designs[0]!.codeBasis) })
  await manager.getRepository(EquipmentItemEntity).save(demoLibrary().map((item) => ({ organizationId, ...item, datasheetFileId: null })))

  const users = await manager.getRepository(UserEntity).findBy({ organizationId })
  const firstOf = (role: Role) => users.find((u) => u.role === role)?.id ?? null
  for (const doc of designs) {
    const project = await manager.getRepository(ProjectEntity).save({
      organizationId,
      code: doc.project.code,
      name: doc.project.name,
      customerName: doc.project.owner,
      customerEmail: null,
      customerPhone: null,
      siteAddress: doc.project.siteAddress,
      siteCity: doc.project.city,
      jurisdictionId: jurisdiction.id,
      utility: doc.project.utility,
      systemKind: doc.systemKind,
      status: 'draft',
      designerId: firstOf('designer'),
      reviewerId: firstOf('reviewer'),
      coordinatorId: firstOf('coordinator'),
      targetSubmissionDate: null,
      archivedAt: null,
      createdBy: firstOf('designer'),
    })
    await manager.getRepository(DesignEntity).save({
      organizationId,
      projectId: project.id,
      document: doc,
      ...indexedColumns(doc),
      evaluation: null,
      evaluationStatus: null,
      evaluatedVersion: null,
      evaluatedAt: null,
      updatedBy: firstOf('designer'),
    })
  }
  return 'created'
}
