import { computed, ref, shallowRef } from 'vue'
import type { ReviewCommentDto } from '@shared/schemas/review'
import { ApiError } from '@/api/errors'
import { reviewApi } from '@/api/review'

/** Open comments first, then resolved ones, each newest first: the order the API lists them in. */
function inListOrder(comments: ReviewCommentDto[]): ReviewCommentDto[] {
  return [...comments].sort((a, b) => Number(a.resolved !== null) - Number(b.resolved !== null) || b.createdAt.localeCompare(a.createdAt))
}

/** A project's review comments, kept in the API's order as the threads change. */
export function useReviewComments(projectId: () => string) {
  const comments = shallowRef<ReviewCommentDto[]>([])
  const problem = ref<string | null>(null)
  const openCount = computed(() => comments.value.filter((c) => c.resolved === null).length)

  async function load(): Promise<void> {
    problem.value = null
    try {
      comments.value = (await reviewApi.comments(projectId())).items
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      problem.value = `The comments could not be loaded. ${error.message}`
    }
  }

  /** A comment the API answered with after a write: new, or replacing the copy shown. */
  function put(comment: ReviewCommentDto): void {
    comments.value = inListOrder([comment, ...comments.value.filter((c) => c.id !== comment.id)])
  }

  return { comments, openCount, problem, load, put }
}
