import { z } from '@shared/schemas/zod'
import { athleteRowSchema, type AthleteRow } from '@shared/schemas/athlete.schema'
import { request } from './client'

const athleteListSchema = z.object({ athletes: z.array(athleteRowSchema) })

export async function listAthletes(): Promise<AthleteRow[]> {
  return (await request('GET', '/athletes', { schema: athleteListSchema })).athletes
}

/** Ends the coaching link; the athlete keeps their account and all their data. */
export async function removeAthlete(id: number): Promise<void> {
  await request('DELETE', `/athletes/${id}`)
}
