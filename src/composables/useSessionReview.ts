import type { SessionReport, TakeNextStepInput } from '@shared/schemas/run.schema'
import type { SessionReview } from '@shared/schemas/review.schema'
import type { SessionDetail } from '@shared/schemas/session.schema'
import { getReport, takeNextSteps } from '@/api/run'
import { getSession } from '@/api/sessions'
import { addComment, getSessionReview, listReviewDesk, markSessionReviewed } from '@/api/review'
import { useAsync } from './useAsync'

export interface SessionReviewData {
  detail: SessionDetail
  report: SessionReport
  review: SessionReview
  athleteName: string | null
}

/**
 * A coach's review of one finished session: sets target against actual, the report with its
 * next steps, flags and comments; commenting, taking a next step for the athlete (a choice the
 * lifter had, a plateau option or an edited target) and marking it reviewed.
 * `athleteName` comes from the desk row that opened it; without it the desk is asked.
 */
export function useSessionReview(id: number, athleteName: string | null = null) {
  const async = useAsync<SessionReviewData>(async () => {
    const [detail, report, review] = await Promise.all([getSession(id), getReport(id), getSessionReview(id)])
    let name = athleteName
    if (name === null) {
      const rows = await listReviewDesk({ status: 'all', athleteId: detail.athleteId, limit: 200 }).catch(() => [])
      name = rows[0]?.athlete.name ?? null
    }
    return { detail, report, review, athleteName: name }
  })

  function patch(change: Partial<SessionReviewData>) {
    if (async.data.value) async.data.value = { ...async.data.value, ...change }
  }

  async function comment(body: string, setLogId: string | null) {
    const created = await addComment(id, { body, setLogId })
    const review = async.data.value?.review
    if (review) patch({ review: { ...review, comments: [...review.comments, created] } })
    return created
  }

  async function markReviewed() {
    patch({ review: await markSessionReviewed(id) })
  }

  async function takeNextStep(step: TakeNextStepInput) {
    const report = await takeNextSteps(id, { steps: [step] })
    // The answer's report says who chose each next step, so "Changed by coach" shows from it.
    patch({ report })
  }

  return { ...async, comment, markReviewed, takeNextStep }
}
