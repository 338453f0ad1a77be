import type { Role } from '@shared/auth/roles'
import type { ProjectDto } from '@shared/schemas/project'

/** What the signed-in member may do in the comment threads; the server checks the same on every call. */
export interface ReviewPermissions {
  comment: boolean
  reply: boolean
  resolve: boolean
  reopen: boolean
}

/** The review is discussed while the set is with the reviewer or back with the designer. */
const DISCUSSION_STATUSES: readonly ProjectDto['status'][] = ['in_review', 'changes_requested']
const THREAD_ROLES: readonly Role[] = ['designer', 'reviewer', 'admin']

export function reviewPermissions(project: ProjectDto, role: Role, userId: string | undefined): ReviewPermissions {
  // another electrician named on the project speaks for the review side, not this one
  const reviewerElsewhere = role === 'reviewer' && project.reviewer !== null && project.reviewer.id !== userId
  const discussing = !project.archivedAt && !reviewerElsewhere && DISCUSSION_STATUSES.includes(project.status)
  const reviewing = discussing && role === 'reviewer'
  return {
    comment: reviewing && project.status === 'in_review',
    reply: discussing && THREAD_ROLES.includes(role),
    resolve: discussing && THREAD_ROLES.includes(role),
    reopen: reviewing,
  }
}
