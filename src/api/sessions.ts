import { z } from '@shared/schemas/zod'
import {
  sessionDetailSchema,
  sessionSummarySchema,
  type SessionDetail,
  type SessionSummary,
} from '@shared/schemas/session.schema'
import { request } from './client'

const sessionListSchema = z.object({ sessions: z.array(sessionSummarySchema) })
const sessionEnvelopeSchema = z.object({ session: sessionDetailSchema })

export interface ListSessionsParams {
  athleteId?: number
  limit?: number
}

export async function listSessions(params: ListSessionsParams = {}): Promise<SessionSummary[]> {
  const query = { athleteId: params.athleteId, limit: params.limit }
  return (await request('GET', '/sessions', { query, schema: sessionListSchema })).sessions
}

export async function getSession(id: number): Promise<SessionDetail> {
  return (await request('GET', `/sessions/${id}`, { schema: sessionEnvelopeSchema })).session
}
