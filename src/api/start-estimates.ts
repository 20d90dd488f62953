import type { SetStartEstimatesInput, StartEstimatesAnswer } from '@shared/schemas/start-estimate.schema'
import { request } from './client'

/** A coach's starting estimates for an athlete: a recent set per plan exercise they have not logged yet. */

/** Loaded beside the request: only the coach's starting-loads screen needs this schema. */
const answerSchema = () => import('@shared/schemas/start-estimate.schema').then((m) => m.startEstimatesAnswerSchema)

/** Every exercise of the athlete's plan, whether it has history, and the kept estimate (their coach only). */
export function getStartEstimates(athleteId: number): Promise<StartEstimatesAnswer> {
  return request('GET', `/athletes/${athleteId}/start-estimates`, { schema: answerSchema })
}

/** Keeps recent sets (loads in kg as logged) as starting estimates; answers with every row again. */
export function saveStartEstimates(athleteId: number, input: SetStartEstimatesInput): Promise<StartEstimatesAnswer> {
  return request('PUT', `/athletes/${athleteId}/start-estimates`, { body: input, schema: answerSchema })
}
