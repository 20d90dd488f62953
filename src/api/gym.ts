import type { GymAnswer, GymInput } from '@shared/schemas/gym.schema'
import { request } from './client'

/** Loaded beside the request: the gym screens are the only ones that need this schema. */
const answerSchema = () => import('@shared/schemas/gym.schema').then((m) => m.gymAnswerSchema)

/** The signed-in lifter's gym; their unit's preset (savedAt null) until one is saved. */
export function getMyGym(): Promise<GymAnswer> {
  return request('GET', '/me/gym', { schema: answerSchema })
}

export function saveMyGym(gym: GymInput): Promise<GymAnswer> {
  return request('PUT', '/me/gym', { body: gym, schema: answerSchema })
}

/** An athlete's gym, for their coach (404 for anyone else's athlete). */
export function getAthleteGym(athleteId: number): Promise<GymAnswer> {
  return request('GET', `/athletes/${athleteId}/gym`, { schema: answerSchema })
}

export function saveAthleteGym(athleteId: number, gym: GymInput): Promise<GymAnswer> {
  return request('PUT', `/athletes/${athleteId}/gym`, { body: gym, schema: answerSchema })
}
