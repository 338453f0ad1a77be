import { ref } from 'vue'
import { ApiError } from '@/api/errors'

/**
 * One file picked in an `<input type="file">` and sent, with its progress (0–100, null when idle)
 * and the API's refusal in words. The input is cleared afterwards, so the same file can be picked
 * again after a fix.
 */
export function useFileUpload<T>(send: (file: File, onProgress: (percent: number) => void) => Promise<T>, describe: (error: ApiError) => string = (error) => error.message) {
  const percent = ref<number | null>(null)
  const problem = ref<string | null>(null)

  /** The answer of the upload, or undefined when nothing was picked or the API refused it. */
  async function pick(event: Event): Promise<T | undefined> {
    const input = event.target as HTMLInputElement
    const file = input.files?.[0]
    if (!file) return undefined
    problem.value = null
    percent.value = 0
    try {
      return await send(file, (p) => (percent.value = p))
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      problem.value = describe(error)
      return undefined
    } finally {
      percent.value = null
      input.value = ''
    }
  }

  return { percent, problem, pick }
}
