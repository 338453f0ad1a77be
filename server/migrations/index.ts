import { Foundation1764633600000 } from './1764633600000-foundation'
import { DesignWorkspace1764720000000 } from './1764720000000-design-workspace'
import { PlanSetRevisions1764806400000 } from './1764806400000-plan-set-revisions'
import { Workflow1764892800000 } from './1764892800000-workflow'
import { RevisionStamps1764979200000 } from './1764979200000-revision-stamps'
import { Submissions1764979320000 } from './1764979320000-submissions'
import { Notifications1764979380000 } from './1764979380000-notifications'
import { ReviewComments1764979440000 } from './1764979440000-review-comments'
import { UsersChanged1765065600000 } from './1765065600000-users-changed'

/** Every migration in order. A new migration is added here as well as in its own file. */
export const MIGRATIONS = [Foundation1764633600000, DesignWorkspace1764720000000, PlanSetRevisions1764806400000, Workflow1764892800000, RevisionStamps1764979200000, Submissions1764979320000, Notifications1764979380000, ReviewComments1764979440000, UsersChanged1765065600000]
