import { Foundation1764633600000 } from './1764633600000-foundation'
import { DesignWorkspace1764720000000 } from './1764720000000-design-workspace'
import { PlanSetRevisions1764806400000 } from './1764806400000-plan-set-revisions'
import { Workflow1764892800000 } from './1764892800000-workflow'

/** Every migration in order. A new migration is added here as well as in its own file. */
export const MIGRATIONS = [Foundation1764633600000, DesignWorkspace1764720000000, PlanSetRevisions1764806400000, Workflow1764892800000]
