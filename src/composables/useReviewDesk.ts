import { computed, reactive, ref, watch } from 'vue'
import type { ReviewDeskQuery, ReviewDeskRow } from '@shared/schemas/review.schema'
import { listReviewDesk } from '@/api/review'
import { useAsync } from './useAsync'

export type ReviewDeskStatus = ReviewDeskQuery['status']

/**
 * The coach's review desk: finished sessions, newest first, by status and athlete. Changing
 * either reloads; rows that no longer match (an answer that arrives late) are left out.
 */
export function useReviewDesk() {
  const status = ref<ReviewDeskStatus>('waiting')
  const athleteId = ref<number | null>(null)
  /** Every athlete seen on the desk so far, for the athlete filter. */
  const seen = reactive(new Map<number, string>())

  const async = useAsync(async () => {
    const rows = await listReviewDesk({ status: status.value, athleteId: athleteId.value ?? undefined })
    for (const row of rows) seen.set(row.athlete.id, row.athlete.name)
    return rows
  })
  watch([status, athleteId], () => void async.refresh())

  const rows = computed<ReviewDeskRow[]>(() =>
    (async.data.value ?? []).filter(
      (row) =>
        (athleteId.value === null || row.athlete.id === athleteId.value) &&
        (status.value === 'all' || (status.value === 'reviewed') === (row.reviewedAt !== null)),
    ),
  )
  const athletes = computed(() =>
    [...seen].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name)),
  )

  return { ...async, rows, status, athleteId, athletes }
}
