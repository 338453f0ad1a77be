import { computed, ref, shallowRef } from 'vue'
import type { Evaluation } from '@shared/electrical/evaluate'
import type { ProjectDto } from '@shared/schemas/project'
import { ApiError } from '@/api/errors'
import { projectsApi } from '@/api/projects'
import { reviewApi } from '@/api/review'
import { revisionsApi } from '@/api/revisions'
import { workflowApi } from '@/api/workflow'
import { revisionInWorkflow, type RevisionInWorkflow } from './reviewRevision'

/** What a review looks at: the project, the revision in the workflow, its calculations and its circuits. */
export function useReviewSubject(projectId: () => string) {
  const project = ref<ProjectDto | null>(null)
  const subject = shallowRef<RevisionInWorkflow | null>(null)
  const evaluation = shallowRef<Evaluation | null>(null)
  const stringIds = shallowRef<string[]>([])
  const problem = ref<string | null>(null)
  const calculationsProblem = ref<string | null>(null)
  const loaded = ref(false)
  /** Project and revision whose files are shown: a reload after a step does not fetch them again. */
  let filesShown: string | null = null

  /** Runs and strings of the revision: what a comment may be pinned to as a circuit. */
  const circuits = computed(() => [...(evaluation.value?.runs.map((r) => r.id) ?? []), ...stringIds.value])

  async function showFilesOf(number: number | null): Promise<void> {
    const key = number === null ? null : `${projectId()}/${number}`
    if (key === filesShown) return
    filesShown = null
    evaluation.value = null
    stringIds.value = []
    calculationsProblem.value = null
    if (number === null) return
    try {
      const [calculations, design] = await Promise.all([reviewApi.calculations(projectId(), number), reviewApi.design(projectId(), number)])
      evaluation.value = calculations
      stringIds.value = design.topology.strings.map((s) => s.id)
      filesShown = key
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      calculationsProblem.value = `The calculations of revision ${number} could not be loaded. ${error.message}`
    }
  }

  async function load(): Promise<void> {
    const id = projectId()
    problem.value = null
    try {
      const [current, timeline, revisions] = await Promise.all([projectsApi.get(id), workflowApi.timeline(id), revisionsApi.list(id)])
      project.value = current
      subject.value = revisionInWorkflow(timeline, revisions.items)
      await showFilesOf(subject.value?.revision.number ?? null)
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      problem.value = error.message
    } finally {
      loaded.value = true
    }
  }

  return { project, subject, evaluation, circuits, problem, calculationsProblem, loaded, load }
}
