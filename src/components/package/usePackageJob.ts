import { onScopeDispose, ref } from 'vue'
import type { PackageJobDto } from '@shared/schemas/revision'
import { ApiError } from '@/api/errors'
import { revisionsApi } from '@/api/revisions'

/** How often a running generation is asked for its step [ms]. */
export const JOB_POLL_MS = 1000

export const isJobActive = (job: PackageJobDto | null) => job !== null && (job.state === 'queued' || job.state === 'running')

/**
 * Follows one background generation: asks the API for the job about once a second while it is
 * queued or running and stops when it ends or when the calling component goes away.
 */
export function usePackageJob(projectId: () => string, onCompleted: (job: PackageJobDto) => void) {
  const job = ref<PackageJobDto | null>(null)
  /** Why the last poll or retry failed; polling goes on, the job may still be running. */
  const problem = ref<string | null>(null)
  let timer: ReturnType<typeof setTimeout> | undefined
  let stopped = false

  function stop(): void {
    clearTimeout(timer)
    timer = undefined
  }

  function follow(next: PackageJobDto | null): void {
    stop()
    job.value = next
    if (next?.state === 'completed') onCompleted(next)
    if (next && isJobActive(next) && !stopped) timer = setTimeout(() => void poll(next.id), JOB_POLL_MS)
  }

  async function poll(jobId: string): Promise<void> {
    try {
      const fresh = await revisionsApi.job(projectId(), jobId)
      problem.value = null
      if (!stopped) follow(fresh)
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      problem.value = error.message
      if (!stopped) timer = setTimeout(() => void poll(jobId), JOB_POLL_MS)
    }
  }

  async function retry(): Promise<void> {
    if (!job.value) return
    try {
      problem.value = null
      follow(await revisionsApi.retry(projectId(), job.value.id))
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      problem.value = error.message
    }
  }

  onScopeDispose(() => {
    stopped = true
    stop()
  })

  return { job, problem, follow, retry }
}
