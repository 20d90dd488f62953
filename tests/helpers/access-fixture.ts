import { randomUUID } from 'node:crypto'
import { existsSync, readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { simpleParser } from 'mailparser'
import request from 'supertest'
import { QueryTypes, type Sequelize } from 'sequelize'
import { ExerciseModel } from '../../server/db'
import { exerciseLibrary } from '../../server/db/seed/exercise-library'
import { DEFAULT_REST_SECONDS, DEFAULT_SCHEMES, type SlotRole } from '../../shared/domain/schemes'
import type { Role } from '../../shared/schemas/common.schema'
import type { Exercise } from '../../shared/schemas/exercise.schema'
import type { Plan, PlanInput } from '../../shared/schemas/plan.schema'
import type { RunSession, RunSet } from '../../shared/schemas/run.schema'
import { TEST_PASSWORD, type TestApp } from './test-app'

/**
 * The world the access matrix runs in: lifter A (the owner) coached by coach A, lifter B
 * coached by coach B, and an admin; besides them coach C (who invites lifter A in one case)
 * and a probe account for signing in. Lifter A and coach A have one of every kind of object
 * the API addresses, made through the API itself wherever a route exists (only the shared
 * exercise library and the admin account are written straight to the database: no route
 * makes them).
 */

export const ACTORS = ['anonymous', 'lifterA', 'lifterB', 'coachA', 'coachB', 'admin'] as const
export type ActorName = (typeof ACTORS)[number]
export type SignedIn = Exclude<ActorName, 'anonymous'>
/** The actors, and coach C: a coach outside the matrix who invites lifter A (coach B must stay a stranger to lifter A). */
export type Caller = ActorName | 'coachC'
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'

/** Registered through the API; not on the common-passwords list. */
export const WORLD_PASSWORD = 'matrix-owner-password-1'

export interface Account {
  id: number
  role: Role
  displayName: string
  email: string
  password: string
  token: string
}

/** The note lifter A writes when finishing the running session during the matrix. */
export const closingNote = (tag: string) => `Closing note of lifter A ${tag}`

/** A minimal ISO base media file head: size, "ftyp", brand "isom" (ISO/IEC 14496-12), then filler. */
export function fakeMp4(bytes = 2048) {
  const buf = Buffer.alloc(bytes)
  buf.writeUInt32BE(24, 0)
  buf.write('ftypisom', 4, 'latin1')
  for (let i = 12; i < bytes; i++) buf[i] = i % 251
  return buf
}

const today = () => new Date().toISOString().slice(0, 10)

/** A plan slot with the role's default scheme and rest. */
export function slot(exercise: Exercise, role: SlotRole) {
  return { exerciseId: exercise.id, role, scheme: DEFAULT_SCHEMES[role], restSec: DEFAULT_REST_SECONDS[role] }
}

/** A plan as a PUT body, ids kept, so sending it back changes nothing. */
export function planAsInput(plan: Plan): PlanInput {
  return {
    name: plan.name,
    splitKind: plan.splitKind,
    days: plan.days.map((d) => ({
      id: d.id,
      name: d.name,
      isRest: d.isRest,
      versions: {
        I: d.versions.I.map((s) => ({ id: s.id, exerciseId: s.exerciseId, role: s.role, scheme: s.scheme, restSec: s.restSec })),
        II: d.versions.II.map((s) => ({ id: s.id, exerciseId: s.exerciseId, role: s.role, scheme: s.scheme, restSec: s.restSec })),
      },
    })),
  }
}

/** The body that logs a set as done, keeping its plan fields. */
export function logBody(set: RunSet, extra: Partial<Record<keyof RunSet, unknown>> = {}) {
  return {
    exerciseId: set.exerciseId, slotId: set.slotId, position: set.position, kind: set.kind,
    targetLoadKg: set.targetLoadKg, targetRepsMin: set.targetRepsMin, targetRepsMax: set.targetRepsMax,
    targetReps: set.targetReps, toFailure: set.toFailure, targetRir: set.targetRir,
    loadKg: set.loadKg ?? set.targetLoadKg ?? 40, reps: set.reps ?? set.targetReps ?? set.targetRepsMin ?? 5,
    rir: null, failure: false, skipped: false, note: set.note,
    loggedAt: set.loggedAt ?? new Date().toISOString(), editedAt: new Date().toISOString(),
    ...extra,
  }
}

/** Every row of every table, one JSON text per table, to prove that a refused request changed nothing. */
export async function snapshotDb(sequelize: Sequelize): Promise<Record<string, string>> {
  const tables = await sequelize.query<{ name: string }>(
    "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name",
    { type: QueryTypes.SELECT },
  )
  const out: Record<string, string> = {}
  for (const { name } of tables) out[name] = JSON.stringify(await sequelize.query(`SELECT * FROM "${name}" ORDER BY rowid`, { type: QueryTypes.SELECT }))
  return out
}

/** The tables whose rows differ between two snapshots, with both versions of those tables. */
export function changedTables(before: Record<string, string>, after: Record<string, string>) {
  return Object.keys({ ...before, ...after })
    .filter((k) => before[k] !== after[k])
    .map((table) => ({ table, before: before[table], after: after[table] }))
}

export class AccessWorld {
  accounts = {} as Record<SignedIn | 'coachC', Account>
  /** An account nobody else's data touches, for the sign-in route. */
  probe = { email: '', password: WORLD_PASSWORD }
  library: Exercise[] = []
  /** Coach A's own exercise, used in coach A's plan. */
  custom!: Exercise
  /** Coach A's plan, assigned to lifter A. */
  plan!: Plan
  /** Lifter A's own plan, not assigned. */
  ownPlan!: Plan
  /** Lifter A's first finished session: reviewed, commented, a video on its top set. */
  finishedId = 0
  /** Lifter A's second finished session, waiting for review. */
  waitingId = 0
  videoId = 0
  videoSetId = ''
  /** Coach A's invitation to someone without an account yet. */
  pendingInvite = { token: '', email: '', name: '' }
  /** Lifter B's and coach B's own objects, for requests that name lifter A's objects inside them. */
  b = { runningId: 0, finishedId: 0, setId: '', exerciseId: 0, videoId: 0, videoSig: '', planId: 0 }
  /**
   * Strings that exist only in lifter A's data (lifterA), in coach A's (coachA), in coach A's
   * invitations (invitation), and in lifter B's or coach B's (b). Set ids are added as sets are made.
   */
  markers = { lifterA: [] as string[], coachA: [] as string[], invitation: [] as string[], b: [] as string[] }
  private usedLinks = new Set<string>()
  /** Outbox files already read, with their recipient and text (each file is parsed once). */
  private mail = new Map<string, { to: string; text: string }>()
  private extraPosition = 90_000

  private constructor(readonly t: TestApp, readonly tag: string) {}

  req(actor: Caller, method: Method, url: string, body?: unknown, video?: Buffer) {
    let r = request(this.t.app)[method](url)
    if (actor !== 'anonymous') r = r.set('Authorization', `Bearer ${this.accounts[actor].token}`)
    if (video) return r.attach('video', video, 'set.mp4')
    return body === undefined ? r : r.send(body as object)
  }

  /** A request that must succeed with this status; answers the body. */
  async ok<T = Record<string, unknown>>(actor: Caller, method: Method, url: string, status: number, body?: unknown, video?: Buffer): Promise<T> {
    const res = await this.req(actor, method, url, body, video)
    if (res.status !== status) {
      throw new Error(`fixture: ${actor} ${method.toUpperCase()} ${url} answered ${res.status}, expected ${status}: ${res.text.slice(0, 400)}`)
    }
    return res.body as T
  }

  /** The token of the newest unused link of this kind e-mailed to this address. */
  async linkSentTo(email: string, kind: 'invite' | 'reset-password') {
    const pattern = new RegExp(`${this.t.config.appUrl}/${kind}/([A-Za-z0-9_-]+)`)
    const dir = this.t.config.mail.outboxDir
    for (let i = 0; i < 100; i++) {
      const files = existsSync(dir) ? readdirSync(dir).filter((f) => f.endsWith('.eml')).sort() : []
      for (const file of files.filter((f) => !this.mail.has(f))) {
        const parsed = await simpleParser(readFileSync(join(dir, file)))
        const to = Array.isArray(parsed.to) ? parsed.to.map((a) => a.text).join(', ') : (parsed.to?.text ?? '')
        this.mail.set(file, { to, text: parsed.text ?? '' })
      }
      for (const file of files.reverse()) {
        const message = this.mail.get(file)!
        const token = message.to.includes(email) ? pattern.exec(message.text)?.[1] : undefined
        if (token && !this.usedLinks.has(token)) {
          this.usedLinks.add(token)
          return token
        }
      }
      await new Promise((r) => setTimeout(r, 20))
    }
    throw new Error(`fixture: no ${kind} e-mail to ${email}`)
  }

  /** The coach invites the lifter by e-mail and the lifter accepts while signed in. */
  async link(coach: SignedIn | 'coachC', lifter: SignedIn) {
    const { email, displayName } = this.accounts[lifter]
    await this.ok(coach, 'post', '/api/invites', 201, { name: displayName, email })
    const token = await this.linkSentTo(email, 'invite')
    await this.ok(lifter, 'post', `/api/invites/${token}/accept`, 200, {})
  }

  libraryOf(pattern: string) {
    const found = this.library.filter((e) => e.pattern === pattern && !e.custom)
    if (found.length < 3) throw new Error(`fixture: the library has fewer than three ${pattern} exercises`)
    return found
  }

  private noteSets(session: RunSession) {
    for (const s of session.sets) if (!this.markers.lifterA.includes(s.id)) this.markers.lifterA.push(s.id)
  }

  /** Lifter A's session in progress, started (today's plan day) when there is none. */
  async running(): Promise<RunSession> {
    const current = await this.ok<{ session: RunSession | null }>('lifterA', 'get', '/api/sessions/current', 200)
    const session = current.session ?? (await this.ok<{ session: RunSession }>('lifterA', 'post', '/api/sessions', 201, {})).session
    this.noteSets(session)
    return session
  }

  /** A new logged set in lifter A's running session (as a lifter adds one by hand). */
  async freshSet() {
    const session = await this.running()
    const setId = randomUUID()
    this.markers.lifterA.push(setId)
    const exercise = this.libraryOf('horizontal_push')[0]
    const now = new Date().toISOString()
    await this.ok('lifterA', 'put', `/api/sessions/${session.id}/sets/${setId}`, 200, {
      exerciseId: exercise.id, slotId: null, position: this.extraPosition++, kind: 'straight', targetLoadKg: null,
      targetRepsMin: null, targetRepsMax: null, toFailure: false, targetRir: null, loadKg: 50, reps: 5, rir: 2,
      failure: false, skipped: false, note: null, loggedAt: now, editedAt: now,
    })
    return { sessionId: session.id, setId }
  }

  /** A new video of lifter A's, on a new set. */
  async freshVideo() {
    const { sessionId, setId } = await this.freshSet()
    const videoId = (await this.ok<{ video: { id: number } }>('lifterA', 'post', `/api/sets/${setId}/video`, 201, undefined, fakeMp4())).video.id
    return { sessionId, setId, videoId }
  }

  /** Starts a session, logs every planned set (the top set with a note) and finishes it with a note. */
  private async trainAndFinish(note: string, topSetNote: string) {
    const session = (await this.ok<{ session: RunSession }>('lifterA', 'post', '/api/sessions', 201, {})).session
    this.noteSets(session)
    for (const set of session.sets) {
      await this.ok('lifterA', 'put', `/api/sessions/${session.id}/sets/${set.id}`, 200, logBody(set, { note: set.kind === 'top' ? topSetNote : null }))
    }
    await this.ok('lifterA', 'post', `/api/sessions/${session.id}/complete`, 200, { completedAt: new Date().toISOString(), note })
    return session
  }

  private async register(who: SignedIn | 'coachC' | 'probe', role: 'lifter' | 'coach') {
    const label = { lifterA: 'Lifter A', lifterB: 'Lifter B', coachA: 'Coach A', coachB: 'Coach B', coachC: 'Coach C', admin: 'Admin', probe: 'Probe' }[who]
    const displayName = `${label} ${this.tag}`
    const email = `${label.toLowerCase().replace(' ', '.')}.${this.tag}@example.test`
    const res = await request(this.t.app).post('/api/auth/register').send({ name: displayName, email, password: WORLD_PASSWORD, role })
    if (res.status !== 201) throw new Error(`fixture: registering ${email} answered ${res.status}: ${res.text}`)
    return { id: res.body.user.id as number, role, displayName, email, password: WORLD_PASSWORD, token: res.body.token as string }
  }

  static async build(t: TestApp, tag = Math.random().toString(36).slice(2, 8)): Promise<AccessWorld> {
    const w = new AccessWorld(t, tag)
    if ((await ExerciseModel.count({ where: { ownerId: null } })) === 0) {
      await ExerciseModel.bulkCreate(exerciseLibrary.map((e) => ({ ...e, ownerId: null })))
    }

    // People: self-registration for lifters and coaches; an admin is only ever made by hand.
    w.accounts.lifterA = await w.register('lifterA', 'lifter')
    w.accounts.lifterB = await w.register('lifterB', 'lifter')
    w.accounts.coachA = await w.register('coachA', 'coach')
    w.accounts.coachB = await w.register('coachB', 'coach')
    w.accounts.coachC = await w.register('coachC', 'coach')
    w.probe.email = (await w.register('probe', 'lifter')).email
    const admin = await t.userWithToken('admin', `admin-${tag}`)
    w.accounts.admin = { id: admin.user.id, role: 'admin', displayName: admin.user.name, email: admin.user.email, password: TEST_PASSWORD, token: admin.token }
    await w.link('coachA', 'lifterA')
    await w.link('coachB', 'lifterB')

    w.library = (await w.ok<{ exercises: Exercise[] }>('lifterA', 'get', '/api/exercises', 200)).exercises
    const squats = w.libraryOf('squat')
    const presses = w.libraryOf('horizontal_push')

    // Coach A's exercise and plan (with that exercise in it), assigned to lifter A.
    w.custom = (await w.ok<{ exercise: Exercise }>('coachA', 'post', '/api/exercises', 201, {
      name: `Coach A press ${tag}`, pattern: 'horizontal_push', primaryMuscles: ['chest'], secondaryMuscles: ['triceps'],
      equipmentKind: 'dumbbell', loadStepKg: 2, defaultRestSec: 120,
    })).exercise
    w.plan = (await w.ok<{ plan: Plan }>('coachA', 'post', '/api/plans', 201, {
      name: `Plan by coach A ${tag}`,
      splitKind: 'custom',
      days: [{
        name: 'Squat and press', isRest: false,
        versions: {
          I: [slot(squats[0], 'compound_primary'), slot(w.custom, 'accessory')],
          II: [slot(squats[1], 'compound_primary'), slot(presses[1], 'accessory')],
        },
      }],
    })).plan
    await w.ok('coachA', 'post', `/api/plans/${w.plan.id}/assignments`, 201, { athleteIds: [w.accounts.lifterA.id], startDate: today() })

    // Lifter A trains: a finished session with a video, comments and a review; another waiting for review.
    const notes = {
      finished: `Finished note of lifter A ${tag}`, finishedSet: `Top set note of lifter A ${tag}`,
      waiting: `Second session note of lifter A ${tag}`, waitingSet: `Second top set note of lifter A ${tag}`,
      running: `Running set note of lifter A ${tag}`, lifterComment: `Comment by lifter A ${tag}`,
      coachComment: `Comment by coach A ${tag}`,
      // Written by the matrix when lifter A finishes their running session.
      closing: closingNote(tag),
    }
    const first = await w.trainAndFinish(notes.finished, notes.finishedSet)
    w.finishedId = first.id
    const top = first.sets.find((s) => s.kind === 'top')
    if (!top) throw new Error('fixture: the first session has no top set')
    w.videoSetId = top.id
    w.videoId = (await w.ok<{ video: { id: number } }>('lifterA', 'post', `/api/sets/${top.id}/video`, 201, undefined, fakeMp4())).video.id
    await w.ok('coachA', 'post', `/api/sessions/${first.id}/comments`, 201, { body: notes.coachComment, setLogId: top.id })
    await w.ok('lifterA', 'post', `/api/sessions/${first.id}/comments`, 201, { body: notes.lifterComment })
    await w.ok('coachA', 'post', `/api/sessions/${first.id}/reviewed`, 200)
    w.waitingId = (await w.trainAndFinish(notes.waiting, notes.waitingSet)).id

    // A session in progress with one set logged.
    const running = await w.running()
    await w.ok('lifterA', 'put', `/api/sessions/${running.id}/sets/${running.sets[0].id}`, 200, logBody(running.sets[0], { note: notes.running }))
    await w.ok('lifterA', 'post', '/api/body-weights', 201, { date: today(), weightKg: 81.3 })
    w.ownPlan = (await w.ok<{ plan: Plan }>('lifterA', 'post', '/api/plans', 201, {
      name: `Own plan of lifter A ${tag}`,
      days: [{ name: 'Solo press', isRest: false, versions: { I: [slot(presses[0], 'compound_primary')], II: [slot(presses[2], 'compound_primary')] } }],
    })).plan

    // Coach A's pending invitation.
    w.pendingInvite.email = `invitee.${tag}@example.test`
    w.pendingInvite.name = `Invitee of coach A ${tag}`
    await w.ok('coachA', 'post', '/api/invites', 201, { name: w.pendingInvite.name, email: w.pendingInvite.email })
    w.pendingInvite.token = await w.linkSentTo(w.pendingInvite.email, 'invite')

    // Lifter B: a finished and a running session of their own (no plan: empty sessions), a video, and coach B's plan.
    const bStart = async () => (await w.ok<{ session: RunSession }>('lifterB', 'post', '/api/sessions', 201, { empty: true })).session.id
    const bAdd = async (sessionId: number) => {
      const s = (await w.ok<{ session: RunSession }>('lifterB', 'post', `/api/sessions/${sessionId}/exercises`, 200, { exerciseId: presses[0].id, role: 'accessory' })).session
      w.markers.b.push(...s.sets.map((x) => x.id))
      await w.ok('lifterB', 'put', `/api/sessions/${sessionId}/sets/${s.sets[0].id}`, 200, logBody(s.sets[0]))
      return s.sets[0]
    }
    w.b.finishedId = await bStart()
    await bAdd(w.b.finishedId)
    await w.ok('lifterB', 'post', `/api/sessions/${w.b.finishedId}/complete`, 200, { completedAt: new Date().toISOString() })
    w.b.runningId = await bStart()
    const bSet = await bAdd(w.b.runningId)
    w.b.setId = bSet.id
    w.b.exerciseId = bSet.exerciseId
    w.b.videoId = (await w.ok<{ video: { id: number } }>('lifterB', 'post', `/api/sets/${bSet.id}/video`, 201, undefined, fakeMp4())).video.id
    const bUrl = (await w.ok<{ url: string }>('lifterB', 'get', `/api/uploads/${w.b.videoId}/url`, 200)).url
    w.b.videoSig = new URL(bUrl, 'http://x').searchParams.get('sig')!
    const planB = `Plan by coach B ${tag}`
    w.b.planId = (await w.ok<{ plan: Plan }>('coachB', 'post', '/api/plans', 201, {
      name: planB,
      days: [{ name: 'B day', isRest: false, versions: { I: [slot(presses[0], 'compound_primary')], II: [slot(presses[1], 'compound_primary')] } }],
    })).plan.id

    const a = w.accounts
    w.markers.lifterA.push(a.lifterA.email, a.lifterA.displayName, w.ownPlan.name, ...Object.entries(notes).filter(([k]) => k !== 'coachComment').map(([, v]) => v))
    w.markers.coachA.push(a.coachA.email, a.coachA.displayName, w.custom.name, w.plan.name, notes.coachComment)
    w.markers.invitation.push(w.pendingInvite.email, w.pendingInvite.name)
    w.markers.b.push(a.lifterB.email, a.lifterB.displayName, a.coachB.email, a.coachB.displayName, planB)
    return w
  }
}
