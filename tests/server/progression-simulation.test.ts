import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { ExerciseModel } from '../../server/db'
import { exerciseLibrary } from '../../server/db/seed/exercise-library'
import { simulatedSet } from '../../server/db/seed/simulated-lifter'
import { loadForReps } from '../../shared/domain/e1rm'
import type { RunSession, RunSet, SessionReport } from '../../shared/schemas/run.schema'
import { createTestApp, type TestApp } from '../helpers/test-app'

/**
 * The engine followed for months through the API, as a lifter would: every week one session of
 * a barbell bench press (top set and back-off) and an incline dumbbell press (three stepped-down
 * sets), every set done to the reps the lifter's true strength allows, every next step taken
 * with "Take all". The lifter's true strength is an estimated 1RM that rises 0.75 % a week for
 * 24 weeks, then stays flat for 12 (an invented lifter; reps to failure from Epley's formula
 * inverted, r = 30 (1RM / w - 1) (Epley 1985), with 4 % of strength lost per earlier set of the
 * exercise; server/db/seed/simulated-lifter.ts). Deterministic: no day-to-day noise.
 */
const WEEK_MS = 7 * 86_400_000
const RISING_WEEKS = 24
const FLAT_WEEKS = 12
const WEEKLY_GAIN = 0.0075
/**
 * A plateau is flagged within this many exposures of the strength going flat: the engine's
 * window (4 exposures spanning 4 weeks, shared/domain/progression.ts) plus the sessions the lifter
 * needs to use up the gains made just before the stall.
 */
const FLAG_WITHIN_EXPOSURES = 8

interface Lift {
  name: string
  role: 'compound_primary' | 'accessory'
  /** True estimated 1RM at the start, kg. */
  startE1rmKg: number
}
const LIFTS: Lift[] = [
  { name: 'Barbell bench press', role: 'compound_primary', startE1rmKg: 80 },
  { name: 'Incline dumbbell press', role: 'accessory', startE1rmKg: 30 },
]

interface Week {
  week: number
  trueE1rm: Record<string, number>
  /** Planned first working set: load and reps, per lift. */
  planned: Record<string, { loadKg: number; reps: number; repsMin: number; repsMax: number }>
  /** Done first working set, per lift. */
  done: Record<string, { loadKg: number; reps: number }>
  report: SessionReport
  /** Every planned working target of the session, to check the ranges. */
  targets: Array<{ reps: number; min: number; max: number }>
  flags: string[]
}

let t: TestApp
let auth: { Authorization: string }
const weeks: Week[] = []
const start = Date.UTC(2026, 0, 5, 17)

async function api<T>(method: 'get' | 'post' | 'put', path: string, body?: unknown, status = 200): Promise<T> {
  const res = await request(t.app)[method](path).set(auth).send(body as object)
  if (res.status !== status) throw new Error(`${method.toUpperCase()} ${path} answered ${res.status}: ${res.text}`)
  return res.body as T
}

beforeAll(async () => {
  // Tokens outlive the 36 simulated weeks; the server's clock is moved week by week below.
  t = await createTestApp({ JWT_TTL: '400d' })
  await ExerciseModel.bulkCreate(exerciseLibrary.map((e) => ({ ...e, ownerId: null })))
  const exercises = new Map((await ExerciseModel.findAll()).map((e) => [e.name, e.id]))
  vi.useFakeTimers({ toFake: ['Date'] })
  vi.setSystemTime(start)
  auth = (await t.userWithToken('lifter')).auth

  for (let week = 0; week < RISING_WEEKS + FLAT_WEEKS; week++) {
    vi.setSystemTime(start + week * WEEK_MS)
    const trueE1rm = Object.fromEntries(LIFTS.map((l) => [l.name, l.startE1rmKg * (1 + WEEKLY_GAIN * Math.min(week, RISING_WEEKS))]))
    let session = (await api<{ session: RunSession }>('post', '/api/sessions', { empty: true }, 201)).session
    for (const lift of LIFTS) {
      session = (await api<{ session: RunSession }>('post', `/api/sessions/${session.id}/exercises`, { exerciseId: exercises.get(lift.name), role: lift.role })).session
      const exercise = session.exercises.find((e) => e.name === lift.name)!
      const firstWorking = session.sets.find((s) => s.exerciseId === exercise.exerciseId && s.kind !== 'warmup')!
      if (firstWorking.targetLoadKg === null) {
        // No history: the set card asks for a recent set. The lifter enters one set at RIR 2.
        const loadKg = Math.floor(loadForReps(trueE1rm[lift.name], 10) / 2.5) * 2.5
        session = (await api<{ session: RunSession }>('post', `/api/sessions/${session.id}/start-estimate`, { exerciseId: exercise.exerciseId, slotId: null, loadKg, reps: 8, rir: 2 })).session
      }
    }
    const planned: Week['planned'] = {}
    const done: Week['done'] = {}
    const targets: Week['targets'] = []
    let sets: RunSet[] = session.sets
    for (const lift of LIFTS) {
      const exercise = session.exercises.find((e) => e.name === lift.name)!
      let workingDone = 0
      for (const set of sets.filter((s) => s.exerciseId === exercise.exerciseId)) {
        const current = sets.find((s) => s.id === set.id)! // a back-off may have been re-targeted by the top set
        const loadKg = current.targetLoadKg!
        let reps = current.targetReps ?? current.targetRepsMax!
        let rir: number | null = null
        if (current.kind !== 'warmup') {
          targets.push({ reps: current.targetReps!, min: current.targetRepsMin!, max: current.targetRepsMax! })
          const r = simulatedSet({
            e1rmKg: trueE1rm[lift.name], movedKg: loadKg, setsBefore: workingDone, noise: 0.5, noiseReps: 0,
            set: { toFailure: current.toFailure, targetRir: current.targetRir, targetRepsMax: current.targetRepsMax! },
          })
          reps = r.reps
          rir = current.toFailure ? 0 : r.rir
          if (workingDone === 0) {
            planned[lift.name] = { loadKg, reps: current.targetReps!, repsMin: current.targetRepsMin!, repsMax: current.targetRepsMax! }
            done[lift.name] = { loadKg, reps }
          }
          workingDone += 1
        }
        const body = {
          exerciseId: current.exerciseId, slotId: current.slotId, position: current.position, kind: current.kind,
          targetLoadKg: current.targetLoadKg, targetRepsMin: current.targetRepsMin, targetRepsMax: current.targetRepsMax,
          targetReps: current.targetReps, toFailure: current.toFailure, targetRir: current.targetRir,
          loadKg, reps, rir, failure: current.toFailure && current.kind !== 'warmup', skipped: false, note: null,
          loggedAt: new Date().toISOString(), editedAt: new Date().toISOString(),
        }
        const answer = await api<{ set: RunSet; updated: RunSet[] }>('put', `/api/sessions/${session.id}/sets/${current.id}`, body)
        sets = sets.map((s) => answer.updated.find((u) => u.id === s.id) ?? (s.id === answer.set.id ? answer.set : s))
      }
    }
    const report = (await api<{ report: SessionReport }>('post', `/api/sessions/${session.id}/complete`, { completedAt: new Date(Date.now() + 3_600_000).toISOString(), note: null })).report
    // The review desk's flags, as the coach sees them.
    const stored = (await api<{ review: { flags: Array<{ code: string; exercise?: string }> } }>('get', `/api/sessions/${session.id}/review`)).review
    // "Take all": the next step of every exercise.
    const steps = report.exercises.filter((e) => e.nextStep).map((e) => ({
      exerciseId: e.exerciseId, slotId: e.slotId, option: 'next_step', targetLoadKg: e.nextStep!.targetLoadKg, targetReps: e.nextStep!.targetReps,
    }))
    await api('post', `/api/sessions/${session.id}/next-steps`, { steps })
    weeks.push({ week, trueE1rm, planned, done, report, targets, flags: stored.flags.map((f) => `${f.code}:${f.exercise ?? ''}`) })
  }
  vi.useRealTimers()
}, 240_000)

afterAll(async () => {
  vi.useRealTimers()
  await t?.close()
})

describe('a lifter followed for 36 weeks through the API, taking every next step', () => {
  it('plans every target inside its range', () => {
    const all = weeks.flatMap((w) => w.targets)
    expect(all.length).toBeGreaterThan(36 * 4)
    for (const target of all) {
      expect(target.reps).toBeGreaterThanOrEqual(target.min)
      expect(target.reps).toBeLessThanOrEqual(target.max)
    }
  })

  it('flags no plateau and no regression while the lifter gets stronger', () => {
    for (const w of weeks.filter((x) => x.week < RISING_WEEKS)) {
      expect(w.flags.filter((f) => f.startsWith('plateau') || f.startsWith('regression')), `week ${w.week}`).toEqual([])
      for (const e of w.report.exercises) expect(e.plateau, `week ${w.week} ${e.name}`).toBeNull()
    }
  })

  it('flags a plateau on each lift within a stated number of exposures once strength is flat, with the options to act on', () => {
    for (const lift of LIFTS) {
      const flagged = weeks.find((w) => w.week >= RISING_WEEKS && w.flags.includes(`plateau:${lift.name}`))
      expect(flagged, lift.name).toBeDefined()
      expect(flagged!.week - RISING_WEEKS, lift.name).toBeLessThanOrEqual(FLAG_WITHIN_EXPOSURES)
      const report = flagged!.report.exercises.find((e) => e.name === lift.name)!
      expect(report.plateau!.options.map((o) => o.kind)).toEqual(expect.arrayContaining(['rotate_version', 'deload']))
      // The summary and the desk agree: no record on the day the plateau is flagged.
      expect(report.records).toEqual([])
    }
  })

  it('gives a lighter load after a set below its range twice at one load', () => {
    let cuts = 0
    for (const lift of LIFTS) {
      for (let i = 2; i < weeks.length; i++) {
        const [a, b] = [weeks[i - 2], weeks[i - 1]]
        const below = (w: Week) => w.done[lift.name].reps < w.planned[lift.name].repsMin
        if (below(a) && below(b) && a.done[lift.name].loadKg === b.done[lift.name].loadKg) {
          expect(weeks[i].planned[lift.name].loadKg, `${lift.name} week ${i}`).toBeLessThan(b.done[lift.name].loadKg)
          cuts += 1
        }
      }
    }
    expect(cuts).toBeGreaterThan(0)
  })

  it('plans loads that track the true strength', () => {
    for (const lift of LIFTS) {
      for (const w of weeks.slice(3)) {
        // The load the lifter could move for the planned reps (to failure, before any reserve).
        const p = w.planned[lift.name]
        const canDo = loadForReps(w.trueE1rm[lift.name], p.reps)
        expect(Math.abs(p.loadKg / canDo - 1), `${lift.name} week ${w.week}: ${p.loadKg} kg x ${p.reps} against ${canDo.toFixed(1)}`).toBeLessThan(0.12)
      }
      // Over the rising weeks the planned load rises with the strength.
      expect(weeks[RISING_WEEKS - 1].planned[lift.name].loadKg).toBeGreaterThan(weeks[3].planned[lift.name].loadKg)
    }
  })

  it('shows progress as progress: a set done as planned is never a regression, and the gain figures are never negative', () => {
    for (const w of weeks) {
      for (const e of w.report.exercises) {
        if (e.asPlanned) expect(e.regression).toBe(false)
        if (e.nextStep) expect(e.nextStep.gain.pct).toBeGreaterThanOrEqual(0)
        if (e.alternative) expect(e.alternative.gain.pct).toBeGreaterThanOrEqual(0)
      }
    }
  })
})
