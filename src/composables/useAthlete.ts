import { toValue, type MaybeRefOrGetter } from 'vue'
import type { AthleteRow } from '@shared/schemas/athlete.schema'
import { listAthletes, removeAthlete } from '@/api/athletes'
import { ApiError } from '@/api/client'
import { useAsync } from './useAsync'

export interface AthleteWithPlan {
  athlete: AthleteRow
  /** The plan the athlete is on (null without one). */
  planId: number | null
}

/** One of the coach's athletes (from the Athletes list), and removing them. Not the coach's: 404. */
export function useAthlete(id: MaybeRefOrGetter<number>) {
  const loaded = useAsync<AthleteWithPlan>(async () => {
    const athleteId = toValue(id)
    const athlete = (await listAthletes()).find((a) => a.id === athleteId)
    if (!athlete) throw new ApiError(404, 'not_found', 'Athlete not found')
    return { athlete, planId: athlete.planId }
  })

  async function remove() {
    await removeAthlete(toValue(id))
  }

  return { ...loaded, remove }
}
