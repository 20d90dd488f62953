import type {
  AddExerciseInput,
  LogSetInput,
  RunSession,
  RunSet,
  SessionReport,
  StartFromRecentSetInput,
  StartSessionInput,
  SwapExerciseInput,
  TakeNextStepsInput,
} from '@shared/schemas/run.schema'
import { request } from './client'

/** The session runner's endpoints: start, read, log sets, swap, add, give a starting load, finish, take next steps. */

// The runner's store is on the app's start-up path: its answer schemas (zod's work, tens of ms on
// a slow phone) are built on the first request that needs them, beside that request (client.ts).
const envelopes = () => import('./run.envelopes')
const sessionEnvelope = () => envelopes().then((m) => m.sessionEnvelope)
const currentEnvelope = () => envelopes().then((m) => m.currentEnvelope)
const loggedSetSchema = () => envelopes().then((m) => m.loggedSetSchema)
const reportEnvelope = () => envelopes().then((m) => m.reportEnvelope)

/** The lifter's calendar day and clock offset, so the server picks the right day of the split. */
export interface LocalDay {
  date: string
  tzOffset: number
}

export async function startSession(input: Partial<StartSessionInput>, day: LocalDay): Promise<RunSession> {
  return (await request('POST', '/sessions', { body: input, query: { ...day }, schema: sessionEnvelope })).session
}

export async function getCurrentSession(): Promise<RunSession | null> {
  return (await request('GET', '/sessions/current', { schema: currentEnvelope })).session
}

export async function getRunSession(id: number): Promise<RunSession> {
  return (await request('GET', `/sessions/${id}/run`, { schema: sessionEnvelope })).session
}

/** Idempotent by the set's UUID: sending the same body twice changes nothing. */
export function logSet(sessionId: number, setId: string, body: LogSetInput): Promise<{ set: RunSet; updated: RunSet[] }> {
  return request('PUT', `/sessions/${sessionId}/sets/${setId}`, { body, schema: loggedSetSchema })
}

export async function swapExercise(sessionId: number, input: SwapExerciseInput): Promise<RunSession> {
  return (await request('POST', `/sessions/${sessionId}/swap`, { body: input, schema: sessionEnvelope })).session
}

export async function addExercise(sessionId: number, input: AddExerciseInput): Promise<RunSession> {
  return (await request('POST', `/sessions/${sessionId}/exercises`, { body: input, schema: sessionEnvelope })).session
}

/** A recent set (or a find-your-load ramp's last set) as a lift's start: the block's open sets come back planned from it. */
export async function startFromRecentSet(sessionId: number, input: StartFromRecentSetInput): Promise<RunSession> {
  return (await request('POST', `/sessions/${sessionId}/start-estimate`, { body: input, schema: sessionEnvelope })).session
}

export async function completeSession(sessionId: number, input: { completedAt: string; note: string | null }): Promise<SessionReport> {
  return (await request('POST', `/sessions/${sessionId}/complete`, { body: input, schema: reportEnvelope })).report
}

export async function getReport(sessionId: number): Promise<SessionReport> {
  return (await request('GET', `/sessions/${sessionId}/report`, { schema: reportEnvelope })).report
}

export async function takeNextSteps(sessionId: number, input: TakeNextStepsInput): Promise<SessionReport> {
  return (await request('POST', `/sessions/${sessionId}/next-steps`, { body: input, schema: reportEnvelope })).report
}
