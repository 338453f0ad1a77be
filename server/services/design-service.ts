import type { DataSource, EntityManager } from 'typeorm'
import { evaluateDocument } from '../../shared/electrical/evaluate'
import { parseDesign, type DesignDocument } from '../../shared/schemas/design'
import type { DesignDto, DesignEvaluationDto, SaveDesignBody } from '../../shared/schemas/project'
import type { AuthUser } from '../auth/auth-user'
import { preparedQuery } from '../db/prepared'
import { DesignEntity, type Design } from '../entities'
import { conflict, notFound, unprocessable, versionConflict } from '../http/errors'
import type { AuditService } from './audit-service'
import type { ProjectService } from './project-service'
import { isUuid, rethrowUnique, updateAtVersion } from './rows'
import type { WorkflowService } from './workflow-service'

const WHAT = 'Design'
/** Two first saves at once: the second finds the first one's row. */
const FIRST_DESIGN_TAKEN = { designs_project_id_key: { field: 'version', message: 'Someone else saved this project\u2019s first design; reload it' } }

/** A design as reads need it: without the stored evaluation, which is large and only the package uses. */
type StoredDesign = Omit<Design, 'organizationId' | 'schemaVersion' | 'evaluation' | 'updatedBy'>
const STORED_DESIGN_SQL = `SELECT id, project_id AS "projectId", document, system_kind AS "systemKind", nec_edition AS "necEdition",
  module_count AS "moduleCount", dc_watts_stc AS "dcWattsStc", evaluation_status AS "evaluationStatus",
  evaluated_version AS "evaluatedVersion", evaluated_at AS "evaluatedAt", created_at AS "createdAt", updated_at AS "updatedAt", version
  FROM designs WHERE project_id = $1 AND organization_id = $2`

/** Columns taken from the document for lists and reports. */
export function indexedColumns(doc: DesignDocument) {
  const pmax = new Map(doc.equipment.modules.map((m) => [m.id, m.pmaxW]))
  const moduleCount = doc.topology.arrays.reduce((n, a) => n + a.moduleCount, 0)
  const dcWattsStc = doc.topology.arrays.reduce((w, a) => w + a.moduleCount * (pmax.get(a.moduleId) ?? 0), 0)
  return { schemaVersion: doc.schemaVersion, systemKind: doc.systemKind, necEdition: doc.codeBasis.necEdition, moduleCount, dcWattsStc }
}

/** One working design per project, stored as the validated design document. */
export class DesignService {
  constructor(
    private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly projects: ProjectService,
    private readonly workflow: WorkflowService,
  ) {}

  private toDto(d: StoredDesign): DesignDto {
    return {
      projectId: d.projectId,
      document: d.document,
      systemKind: d.systemKind,
      necEdition: d.necEdition,
      moduleCount: d.moduleCount,
      dcWattsStc: d.dcWattsStc,
      lastEvaluation:
        d.evaluationStatus && d.evaluatedAt && d.evaluatedVersion !== null
          ? { status: d.evaluationStatus, evaluatedAt: d.evaluatedAt.toISOString(), forVersion: d.evaluatedVersion, current: d.evaluatedVersion === d.version }
          : null,
      createdAt: d.createdAt.toISOString(),
      updatedAt: d.updatedAt.toISOString(),
      version: d.version,
    }
  }

  /** One prepared query when the design is there; the project is looked up only to say which of the two is missing. */
  private async find(manager: EntityManager, organizationId: string, projectId: string): Promise<StoredDesign> {
    const [design] = isUuid(projectId) ? await preparedQuery<StoredDesign>(manager, STORED_DESIGN_SQL, [projectId, organizationId]) : []
    if (design) return design
    await this.projects.getOwned(organizationId, projectId, manager)
    throw notFound('Design of this project (none saved yet)')
  }

  async get(organizationId: string, projectId: string): Promise<DesignDto> {
    return this.toDto(await this.find(this.db.manager, organizationId, projectId))
  }

  /**
   * Validates the document with the engine's parser (422 naming every bad field as
   * `document.<path>`) and saves it: the first design with `version: null`, later ones at the
   * version read (409 with the current design when someone saved first).
   */
  async save(actor: AuthUser, projectId: string, body: SaveDesignBody): Promise<{ design: DesignDto; created: boolean }> {
    const parsed = parseDesign(body.document)
    if (!parsed.ok) {
      throw unprocessable(
        `The design document has ${parsed.issues.length} problem(s)`,
        parsed.issues.map((i) => ({ field: `document.${i.field}`, message: i.message })),
      )
    }
    const doc = parsed.value
    return this.db.transaction(async (manager) => {
      const project = await this.projects.getOwned(actor.organizationId, projectId, manager)
      if (project.archivedAt) throw conflict('This project is archived; restore it before changing its design')
      if (doc.systemKind !== project.systemKind) {
        throw unprocessable('The design is of another system kind than its project', [
          { field: 'document.systemKind', message: `the project is ${project.systemKind}; change the project first or design a ${project.systemKind} system` },
        ])
      }
      // a stamped set stays with its revision: changing the design starts the project over in draft
      await this.workflow.reopenForDesignEdit(manager, actor, project)
      const repo = manager.getRepository(DesignEntity)
      const existing = await repo.findOneBy({ projectId })
      const changes = { document: doc, ...indexedColumns(doc), updatedBy: actor.id }
      let saved: Design
      if (body.version === null) {
        if (existing) throw versionConflict(WHAT, existing, { current: this.toDto(existing) })
        saved = await repo
          .save({ organizationId: actor.organizationId, projectId, ...changes, evaluation: null, evaluationStatus: null, evaluatedVersion: null, evaluatedAt: null })
          .catch((err: unknown) => rethrowUnique(err, FIRST_DESIGN_TAKEN))
      } else {
        if (!existing) throw conflict('This project has no design yet; save the first one with version null', [{ field: 'version', message: 'must be null for the first design' }])
        saved = await updateAtVersion(manager, DesignEntity, { organizationId: actor.organizationId, id: existing.id, version: body.version }, changes, WHAT, async (current) => ({
          current: this.toDto(current),
        }))
      }
      await this.audit.record(
        { organizationId: actor.organizationId, actorId: actor.id, action: 'design.saved', entityType: 'project', entityId: projectId, data: { version: saved.version, modules: saved.moduleCount } },
        manager,
      )
      return { design: this.toDto(saved), created: body.version === null }
    })
  }

  /**
   * Runs the engine over the stored design and keeps the result with the version it belongs to.
   * Keeping it does not change the design's version: it is derived from the document.
   */
  async evaluate(organizationId: string, projectId: string): Promise<DesignEvaluationDto> {
    const design = await this.find(this.db.manager, organizationId, projectId)
    // the stored document is parsed again: defaults or checks of a newer engine apply to it
    const evaluation = evaluateDocument(design.document)
    await this.db
      .createQueryBuilder()
      .update(DesignEntity)
      .set({ evaluation, evaluationStatus: evaluation.status, evaluatedVersion: design.version, evaluatedAt: new Date(), version: () => 'version', updatedAt: () => 'updated_at' })
      .where('id = :id AND version = :version', { id: design.id, version: design.version })
      .execute()
    return { designVersion: design.version, evaluation }
  }
}
