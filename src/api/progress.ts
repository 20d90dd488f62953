import { z } from '@shared/schemas/zod'
import { progressSchema, type BodyWeightInput, type Progress } from '@shared/schemas/athlete.schema'
import { request } from './client'

const progressEnvelopeSchema = z.object({ progress: progressSchema })
const bodyWeightEnvelopeSchema = z.object({ entry: z.object({ date: z.string(), weightKg: z.number() }) })

export interface ProgressParams {
  /** A coach names the athlete; a lifter leaves it out for their own. */
  athleteId?: number
  weeks?: number
}

/** Chart data: estimated 1RM per exercise, weekly hard sets per muscle, body weight. */
export async function getProgress(params: ProgressParams = {}): Promise<Progress> {
  const query = { athleteId: params.athleteId, weeks: params.weeks }
  return (await request('GET', '/progress', { query, schema: progressEnvelopeSchema })).progress
}

/** The lifter's body weight on a day (kilograms). */
export async function addBodyWeight(input: BodyWeightInput): Promise<BodyWeightInput> {
  return (await request('POST', '/body-weights', { body: input, schema: bodyWeightEnvelopeSchema })).entry
}
