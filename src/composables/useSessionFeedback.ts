import { addComment, getSessionReview } from '@/api/review'
import { useAsync } from './useAsync'

/** The lifter's view of the coach's review of one session: comments, reviewed or not, and replying. */
export function useSessionFeedback(id: number) {
  const async = useAsync(() => getSessionReview(id))

  async function reply(body: string, setLogId: string | null) {
    const created = await addComment(id, { body, setLogId })
    const review = async.data.value
    if (review) async.data.value = { ...review, comments: [...review.comments, created] }
    return created
  }

  return { ...async, reply }
}
