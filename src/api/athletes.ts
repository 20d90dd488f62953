import { z } from 'zod'
import { athleteRowSchema, type AthleteRow } from '@shared/schemas/athlete.schema'
import { request } from './client'

const athleteListSchema = z.object({ athletes: z.array(athleteRowSchema) })

export async function listAthletes(): Promise<AthleteRow[]> {
  return (await request('GET', '/athletes', { schema: athleteListSchema })).athletes
}
