import type { RevisionDto } from '@shared/schemas/revision'
import type { TimelineEntryDto } from '@shared/schemas/workflow'

export interface RevisionInWorkflow {
  revision: RevisionDto
  /** The step that handed it to review; null when none has yet (the newest revision is shown). */
  handedOver: TimelineEntryDto | null
}

/**
 * The revision the review is about: the one the latest "ask for review" step named, else the
 * newest. `timeline` and `revisions` are newest first, as the API sends them.
 */
export function revisionInWorkflow(timeline: readonly TimelineEntryDto[], revisions: readonly RevisionDto[]): RevisionInWorkflow | null {
  const handedOver = timeline.find((entry) => entry.event === 'request_review' && entry.revision !== null) ?? null
  const reviewed = handedOver && revisions.find((r) => r.number === handedOver.revision!.number)
  if (reviewed) return { revision: reviewed, handedOver }
  const newest = revisions[0]
  return newest ? { revision: newest, handedOver: null } : null
}
