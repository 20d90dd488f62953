import type { Response } from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import type { AppConfig } from '../../server/config'
import { SessionModel } from '../../server/db'
import { apiRouter } from '../../server/routes'
import { KG_GYM } from '../../shared/domain/gym'
import type { Plan, RotationProposal } from '../../shared/schemas/plan.schema'
import type { SessionReport } from '../../shared/schemas/run.schema'
import {
  ACTORS, AccessWorld, WORLD_PASSWORD, changedTables, closingNote, fakeMp4, logBody, planAsInput, slot, snapshotDb, type ActorName, type SignedIn,
} from '../helpers/access-fixture'
import { listRoutes } from '../helpers/route-list'
import { createTestApp, type TestApp } from '../helpers/test-app'

/**
 * The access matrix: every route of the API router x {anonymous, lifter A (the owner), lifter B,
 * coach A (lifter A's coach), coach B, an admin}, in one world built through the API (see
 * tests/helpers/access-fixture.ts). The table below has one entry (or more, for a route that can
 * address different owners' objects) per route; the test fails when the router has a route the
 * table lacks, or the table a route the router lacks, so a new route cannot slip past.
 *
 * - allow: the 2xx status named in the entry (200 unless named).
 * - deny: 401 for anonymous, 403 or 404 for a signed-in actor (unless the entry documents
 *   another refusal and why), and every row of every table is as it was before the request.
 * - A documented other answer (a 400 where a coach must name the athlete) also leaves the
 *   database unchanged.
 * - No answer, allowed or refused, carries data that is not the caller's to see: nothing of
 *   lifter A's or coach A's (names, e-mails, notes, comments, set ids, plan and exercise names,
 *   their ids as athleteId/ownerId/author) for lifter B, coach B or anonymous; nothing of lifter
 *   B's or coach B's for lifter A or coach A; none of coach A's invitations for lifter A; unless
 *   the entry documents why (a link that stands for its owner). The admin may see everyone's.
 *
 * Cases run in file order: within a route refused actors go first, so an allowed (possibly
 * destructive) request comes last; objects a route destroys are made fresh for each case, and
 * routes that end accounts run at the very end.
 */

type Ctx = Record<string, unknown>
type Outcome = 'allow' | 'deny' | number

interface Variant {
  /** "METHOD /path" as the router lists it. */
  route: string
  /** Whose object, or what the request asks for. */
  label: string
  allow: readonly ActorName[]
  /** A documented answer other than allow or deny, per actor. */
  other?: { statuses: Partial<Record<ActorName, number>>; why: string }
  /** A documented refusal status other than 401 (anonymous) / 403 or 404 (signed in). */
  denyAs?: { statuses: Partial<Record<ActorName, number[]>>; why: string }
  /** Success statuses; 200 unless named. */
  ok?: number | number[]
  prepare?: (w: AccessWorld, actor: ActorName) => Promise<Ctx>
  url: (w: AccessWorld, ctx: Ctx) => string | Promise<string>
  body?: (w: AccessWorld, actor: ActorName, ctx: Ctx) => unknown
  video?: boolean
  /** Markers an answer may carry whoever asks: the request holds a link that stands for them. */
  exempt?: { markers: (w: AccessWorld) => string[]; why: string }
  /** Extra checks on an allowed answer. */
  check?: (w: AccessWorld, actor: ActorName, res: Response, ctx: Ctx, body: unknown) => void | Promise<void>
  /** Runs after an allowed answer (keeps the world usable). */
  after?: (w: AccessWorld, actor: ActorName, res: Response, ctx: Ctx) => Promise<void>
  /** Ends the caller's account: runs after everything else. */
  last?: boolean
}

const SIGNED_IN = ACTORS.filter((a) => a !== 'anonymous')
const EVERYONE = ACTORS
const LIFTERS = ['lifterA', 'lifterB'] as const
const COACHES = ['coachA', 'coachB'] as const
const AUTHORS = [...LIFTERS, ...COACHES]
/** assertCanSeeAthlete: the lifter themself, a coach linked to them, an admin. */
const SEES_LIFTER_A = ['lifterA', 'coachA', 'admin'] as const
const NAME_THE_ATHLETE = { statuses: { coachA: 400, coachB: 400, admin: 400 }, why: 'coaches and admins must name the athlete (400, nothing read)' }

let seq = 0
const next = () => ++seq
const today = () => new Date().toISOString().slice(0, 10)
const A = (w: AccessWorld) => w.accounts.lifterA
const itsOwnUser = (w: AccessWorld, actor: ActorName, res: Response) => {
  expect(res.body.user.id).toBe(w.accounts[actor as SignedIn].id)
}
const planOf = async (w: AccessWorld, owner: SignedIn, id: number) => (await w.ok<{ plan: Plan }>(owner, 'get', `/api/plans/${id}`, 200)).plan
/** The caller's own password (anonymous has none, and is refused before it is read). */
const passwordOf = (w: AccessWorld, actor: ActorName) => (actor === 'anonymous' ? 'no-account-has-this' : w.accounts[actor].password)
const importBody = { csv: 'date,exercise,load,reps\n2025-03-01,Barbell bench press,60,5\n', unit: 'kg' }

/** The two plans the plan routes address: coach A's (assigned to lifter A) and lifter A's own. */
const PLANS = [
  { label: "coach A's plan, assigned to lifter A", owner: 'coachA' as const, id: (w: AccessWorld) => w.plan.id, readers: SEES_LIFTER_A },
  // Not assigned to anyone: coach A has no athlete on it, so coach A cannot read it.
  { label: "lifter A's own plan, not assigned", owner: 'lifterA' as const, id: (w: AccessWorld) => w.ownPlan.id, readers: ['lifterA', 'admin'] as const },
]

const TABLE: Variant[] = [
  // ---- Public: no sign-in needed ----
  { route: 'GET /health', label: 'public', allow: EVERYONE, url: () => '/api/health' },
  {
    route: 'POST /auth/register', label: 'a new account', allow: EVERYONE, ok: 201, url: () => '/api/auth/register',
    body: (w, actor) => ({ name: `New ${actor}`, email: `new.${actor.toLowerCase()}.${next()}.${w.tag}@example.test`, password: WORLD_PASSWORD, role: 'lifter' }),
    check: (_w, _a, res, _c, body) => expect(res.body.user.email).toBe((body as { email: string }).email),
  },
  {
    route: 'POST /auth/sign-in', label: "an account of nobody else's, with its password", allow: EVERYONE, url: () => '/api/auth/sign-in',
    body: (w) => ({ email: w.probe.email, password: w.probe.password }),
    check: (w, _a, res) => expect(res.body.user.email).toBe(w.probe.email),
  },
  {
    route: 'POST /auth/password-reset', label: "lifter A's e-mail", allow: EVERYONE, ok: 202, url: () => '/api/auth/password-reset',
    body: (w) => ({ email: A(w).email }),
  },
  {
    route: 'POST /auth/password-reset/:token', label: 'the reset link e-mailed to lifter A', allow: EVERYONE,
    prepare: async (w) => {
      await w.ok('anonymous', 'post', '/api/auth/password-reset', 202, { email: A(w).email })
      return { token: await w.linkSentTo(A(w).email, 'reset-password') }
    },
    url: (_w, c) => `/api/auth/password-reset/${c.token}`,
    body: (w) => ({ password: A(w).password }),
    exempt: { markers: (w) => [A(w).email, A(w).displayName], why: 'the link went to lifter A\'s mailbox: whoever holds it is lifter A' },
    check: (w, _a, res) => expect(res.body.user.id).toBe(A(w).id),
    after: async (w, _a, res) => {
      A(w).token = res.body.token
    },
  },
  {
    route: 'GET /invites/:token', label: "coach A's pending invitation", allow: EVERYONE,
    url: (w) => `/api/invites/${w.pendingInvite.token}`,
    exempt: { markers: (w) => [...w.markers.invitation, w.accounts.coachA.displayName], why: 'the link shows whom it invites, and from whom' },
    check: (w, _a, res) => expect(res.body.invite.email).toBe(w.pendingInvite.email),
  },
  {
    route: 'POST /invites/:token/accept', label: "a new invitation of coach A's, to someone without an account", allow: EVERYONE,
    prepare: async (w) => {
      const email = `accept.${next()}.${w.tag}@example.test`
      await w.ok('coachA', 'post', '/api/invites', 201, { name: 'Invited by link', email })
      return { email, token: await w.linkSentTo(email, 'invite') }
    },
    url: (_w, c) => `/api/invites/${c.token}/accept`,
    body: () => ({ password: WORLD_PASSWORD, name: 'Invited by link' }),
    // Whoever holds the link makes the invited account (a signed-in caller's own account is not touched).
    check: (_w, _a, res, c) => expect(res.body.user.email).toBe(c.email),
  },
  {
    route: 'POST /invites/:token/accept', label: "coach C's invitation to lifter A's existing account", allow: ['lifterA'],
    denyAs: {
      statuses: { lifterB: [401], coachA: [401], coachB: [401], admin: [401] },
      why: 'an existing account accepts only while signed in as the invited e-mail: anyone else is asked to sign in as them (401 sign_in_to_accept)',
    },
    prepare: async (w) => {
      // Coach C is outside the matrix: coach B's own invitation list would rightly show lifter A's e-mail.
      await w.ok('coachC', 'post', '/api/invites', 201, { name: A(w).displayName, email: A(w).email })
      return { token: await w.linkSentTo(A(w).email, 'invite') }
    },
    url: (_w, c) => `/api/invites/${c.token}/accept`,
    body: () => ({}),
    exempt: { markers: (w) => [A(w).email], why: 'the refusal names the invited e-mail, which the link\'s preview shows anyway' },
    check: (w, _a, res) => expect(res.body.user.id).toBe(A(w).id),
    // Coach C lets lifter A go again, so lifter A keeps one coach.
    after: async (w) => {
      await w.ok('coachC', 'delete', `/api/athletes/${A(w).id}`, 204)
    },
  },
  {
    route: 'GET /uploads/:id/stream', label: "lifter A's video, with the link lifter A was given", allow: EVERYONE,
    prepare: async (w) => ({ url: (await w.ok<{ url: string }>('lifterA', 'get', `/api/uploads/${w.videoId}/url`, 200)).url }),
    url: (_w, c) => c.url as string,
  },
  {
    route: 'GET /uploads/:id/stream', label: "lifter A's video, with a link signed for lifter B's video", allow: [],
    denyAs: { statuses: { anonymous: [403] }, why: 'no bearer token is read here: the signature is the permission, and it is for another video' },
    url: (w) => `/api/uploads/${w.videoId}/stream?sig=${encodeURIComponent(w.b.videoSig)}`,
  },

  // ---- Signed in, about oneself ----
  { route: 'POST /auth/sign-out', label: 'oneself', allow: SIGNED_IN, ok: 204, url: () => '/api/auth/sign-out' },
  { route: 'GET /me', label: 'oneself', allow: SIGNED_IN, url: () => '/api/me', check: itsOwnUser },
  { route: 'PATCH /me', label: 'oneself', allow: SIGNED_IN, url: () => '/api/me', body: () => ({ unit: 'kg' }), check: itsOwnUser },
  { route: 'POST /me/cautions', label: 'oneself', allow: SIGNED_IN, url: () => '/api/me/cautions', check: itsOwnUser },
  {
    route: 'POST /me/password', label: 'oneself', allow: SIGNED_IN, url: () => '/api/me/password',
    body: (w, actor, c) => {
      c.newPassword = `${WORLD_PASSWORD}-${next()}`
      return { currentPassword: passwordOf(w, actor), newPassword: c.newPassword }
    },
    check: itsOwnUser,
    after: async (w, actor, res, c) => {
      const account = w.accounts[actor as SignedIn]
      // The old token stops working; the new one works.
      expect((await w.req(actor, 'get', '/api/me')).status).toBe(401)
      account.token = res.body.token
      account.password = c.newPassword as string
      expect((await w.req(actor, 'get', '/api/me')).status).toBe(200)
    },
  },
  {
    route: 'DELETE /me', label: 'oneself', allow: SIGNED_IN, ok: 204, url: () => '/api/me', last: true,
    body: (w, actor) => ({ password: passwordOf(w, actor) }),
  },
  { route: 'GET /me/gym', label: 'own gym', allow: LIFTERS, url: () => '/api/me/gym', check: (_w, _a, res) => expect(res.body.gym.barbell.kind).toBe('barbell') },
  {
    // The preset again, so the rest of the matrix plans with the same gym.
    route: 'PUT /me/gym', label: 'own gym', allow: LIFTERS, url: () => '/api/me/gym', body: () => KG_GYM,
    check: (_w, _a, res) => expect(res.body.savedAt).toEqual(expect.any(String)),
  },
  { route: 'GET /exercises', label: 'own library', allow: SIGNED_IN, url: () => '/api/exercises' },
  { route: 'GET /exercises', label: "searching for coach A's exercise by name", allow: SIGNED_IN, url: (w) => `/api/exercises?q=${encodeURIComponent(w.custom.name)}` },
  { route: 'GET /train/today', label: 'own plan', allow: LIFTERS, url: () => '/api/train/today' },
  { route: 'GET /sessions/current', label: 'own session in progress', allow: LIFTERS, url: () => '/api/sessions/current' },
  {
    route: 'POST /sessions', label: "start own session (lifter A's returns the one in progress)", allow: LIFTERS, ok: [200, 201],
    url: () => '/api/sessions', body: (_w, actor) => (actor === 'lifterA' ? {} : { empty: true }),
    check: (w, actor, res) => expect(res.body.session.athleteId).toBe(w.accounts[actor as SignedIn].id),
  },
  { route: 'GET /sessions', label: 'own sessions', allow: LIFTERS, other: NAME_THE_ATHLETE, url: () => '/api/sessions' },
  { route: 'GET /sessions', label: "lifter A's sessions, named", allow: SEES_LIFTER_A, url: (w) => `/api/sessions?athleteId=${A(w).id}` },
  { route: 'GET /progress', label: 'own progress', allow: LIFTERS, other: NAME_THE_ATHLETE, url: () => '/api/progress' },
  { route: 'GET /progress', label: "lifter A's progress, named", allow: SEES_LIFTER_A, url: (w) => `/api/progress?athleteId=${A(w).id}` },
  { route: 'GET /logbook/export', label: 'own logbook', allow: LIFTERS, other: NAME_THE_ATHLETE, url: () => '/api/logbook/export' },
  {
    route: 'GET /logbook/export', label: "lifter A's logbook, named (JSON)", allow: SEES_LIFTER_A,
    url: (w) => `/api/logbook/export?format=json&athleteId=${A(w).id}`,
    check: (w, _a, res) => expect(res.text).toContain(w.markers.lifterA.find((m) => m.startsWith('Finished note'))!),
  },
  { route: 'POST /body-weights', label: 'own body weight', allow: LIFTERS, ok: 201, url: () => '/api/body-weights', body: () => ({ date: today(), weightKg: 79.5 }) },
  { route: 'POST /logbook/import/preview', label: 'own logbook', allow: LIFTERS, url: () => '/api/logbook/import/preview', body: () => importBody },
  { route: 'POST /logbook/import', label: 'own logbook', allow: LIFTERS, ok: 201, url: () => '/api/logbook/import', body: () => importBody },
  { route: 'GET /athletes', label: 'own athletes', allow: COACHES, url: () => '/api/athletes' },
  { route: 'GET /invites', label: 'own invitations', allow: COACHES, url: () => '/api/invites' },
  {
    route: 'POST /invites', label: 'a new invitation', allow: COACHES, ok: 201, url: () => '/api/invites',
    body: (w, actor) => ({ name: 'Matrix invitee', email: `invite.${actor}.${next()}.${w.tag}@example.test` }),
  },
  { route: 'GET /review-desk', label: 'own review desk', allow: COACHES, url: () => '/api/review-desk?status=all' },
  { route: 'GET /review-desk', label: "lifter A's sessions, named", allow: ['coachA'], url: (w) => `/api/review-desk?status=all&athleteId=${A(w).id}` },
  {
    route: 'POST /exercises', label: 'a new own exercise', allow: COACHES, ok: 201, url: () => '/api/exercises',
    body: (_w, actor) => ({
      name: `Matrix row ${actor} ${next()}`, pattern: 'horizontal_pull', primaryMuscles: ['lats'], secondaryMuscles: [],
      equipmentKind: 'cable', loadStepKg: 5, defaultRestSec: 90,
    }),
  },
  { route: 'GET /plans', label: 'own plans', allow: AUTHORS, url: () => '/api/plans' },
  {
    route: 'POST /plans', label: 'a new own plan', allow: AUTHORS, ok: 201, url: () => '/api/plans',
    body: (w, actor) => ({
      name: `Matrix plan ${actor} ${next()}`,
      days: [{ name: 'One', isRest: false, versions: { I: [slot(w.libraryOf('squat')[2], 'accessory')], II: [slot(w.libraryOf('squat')[1], 'accessory')] } }],
    }),
  },
  { route: 'GET /plans/templates', label: 'the templates', allow: AUTHORS, url: () => '/api/plans/templates' },
  { route: 'POST /plans/from-template', label: 'a new own plan', allow: AUTHORS, ok: 201, url: () => '/api/plans/from-template', body: () => ({ templateId: 'ppl_twice' }) },
  { route: 'GET /admin/users', label: 'every account', allow: ['admin'], url: () => '/api/admin/users' },

  // ---- Lifter A's objects ----
  {
    route: 'GET /sessions/:id', label: "lifter A's finished session", allow: SEES_LIFTER_A, url: (w) => `/api/sessions/${w.finishedId}`,
    check: (w, _a, res) => expect(res.body.session).toMatchObject({ id: w.finishedId, athleteId: A(w).id }),
  },
  {
    route: 'GET /sessions/:id', label: "lifter A's session in progress", allow: SEES_LIFTER_A,
    prepare: async (w) => ({ id: (await w.running()).id }),
    url: (_w, c) => `/api/sessions/${c.id}`,
  },
  { route: 'GET /sessions/:id/report', label: "lifter A's finished session", allow: SEES_LIFTER_A, url: (w) => `/api/sessions/${w.finishedId}/report` },
  {
    route: 'GET /sessions/:id/review', label: "lifter A's finished session", allow: SEES_LIFTER_A, url: (w) => `/api/sessions/${w.finishedId}/review`,
    check: (_w, _a, res) => expect(res.body.review.comments.length).toBeGreaterThanOrEqual(2),
  },
  {
    route: 'GET /sessions/:id/run', label: "lifter A's session in progress", allow: ['lifterA'],
    prepare: async (w) => ({ id: (await w.running()).id }),
    url: (_w, c) => `/api/sessions/${c.id}/run`,
  },
  ...PLANS.map((p): Variant => ({
    route: 'GET /plans/:id', label: p.label, allow: p.readers, url: (w) => `/api/plans/${p.id(w)}`,
    check: (w, _a, res) => expect(res.body.plan.id).toBe(p.id(w)),
  })),
  {
    route: 'GET /uploads/:id/url', label: "lifter A's video", allow: ['lifterA', 'coachA'],
    // upload.service: only the lifter and their coach watch a video; admins manage accounts, not form checks.
    url: (w) => `/api/uploads/${w.videoId}/url`,
  },
  // gym.service: only the athlete's coach edits their gym (the lifter uses /me/gym; admins manage accounts).
  {
    route: 'GET /athletes/:id/gym', label: "lifter A's gym", allow: ['coachA'], url: (w) => `/api/athletes/${A(w).id}/gym`,
    check: (_w, _a, res) => expect(res.body.gym.barbell.kind).toBe('barbell'),
  },
  {
    route: 'PUT /athletes/:id/gym', label: "lifter A's gym", allow: ['coachA'], url: (w) => `/api/athletes/${A(w).id}/gym`,
    body: () => KG_GYM,
    check: async (w, _a, res) => {
      // Saved for lifter A: lifter A reads the same save.
      expect((await w.ok<{ savedAt: string }>('lifterA', 'get', '/api/me/gym', 200)).savedAt).toBe(res.body.savedAt)
    },
  },
  // start-estimate.service: only the athlete's coach (the lifter enters a recent set on the set card).
  {
    route: 'GET /athletes/:id/start-estimates', label: "lifter A's starting estimates", allow: ['coachA'], url: (w) => `/api/athletes/${A(w).id}/start-estimates`,
    check: (_w, _a, res) => expect(res.body.estimates.length).toBeGreaterThan(0),
  },
  {
    route: 'PUT /athletes/:id/start-estimates', label: "lifter A's starting estimates", allow: ['coachA'], url: (w) => `/api/athletes/${A(w).id}/start-estimates`,
    prepare: async (w) => {
      const { estimates } = await w.ok<{ estimates: Array<{ exerciseId: number }> }>('coachA', 'get', `/api/athletes/${A(w).id}/start-estimates`, 200)
      return { exerciseId: estimates[0].exerciseId }
    },
    body: (_w, _a, c) => ({ estimates: [{ exerciseId: c.exerciseId, loadKg: 50, reps: 8 }] }),
    check: (_w, _a, res, c) => expect(res.body.estimates.find((e: { exerciseId: number }) => e.exerciseId === c.exerciseId).setBy).toBe('coach'),
  },
  {
    route: 'PATCH /admin/users/:id', label: "lifter A's account", allow: ['admin'], url: (w) => `/api/admin/users/${A(w).id}`,
    body: () => ({ active: true }),
  },
  {
    route: 'PUT /sessions/:id/sets/:setId', label: "a set of lifter A's session in progress", allow: ['lifterA'],
    prepare: async (w) => {
      const run = await w.running()
      const set = run.sets.find((s) => s.loggedAt === null) ?? run.sets[0]
      return { id: run.id, setId: set.id, body: logBody(set) }
    },
    url: (_w, c) => `/api/sessions/${c.id}/sets/${c.setId}`,
    body: (_w, _a, c) => c.body,
  },
  {
    route: 'POST /sessions/:id/swap', label: "lifter A's session in progress", allow: ['lifterA'],
    prepare: async (w) => {
      const run = await w.running()
      for (const ex of run.exercises) {
        const open = run.sets.some((s) => s.exerciseId === ex.exerciseId && s.slotId === ex.slotId && s.loggedAt === null && !s.skipped)
        const to = w.library.find((e) => !e.custom && e.pattern === ex.pattern && !run.exercises.some((x) => x.exerciseId === e.id))
        if (open && to) return { id: run.id, body: { exerciseId: ex.exerciseId, slotId: ex.slotId, toExerciseId: to.id } }
      }
      throw new Error('no exercise to swap in the running session')
    },
    url: (_w, c) => `/api/sessions/${c.id}/swap`,
    body: (_w, _a, c) => c.body,
  },
  {
    route: 'POST /sessions/:id/exercises', label: "lifter A's session in progress", allow: ['lifterA'],
    prepare: async (w) => ({ id: (await w.running()).id }),
    url: (_w, c) => `/api/sessions/${c.id}/exercises`,
    body: (w) => ({ exerciseId: w.libraryOf('hinge')[0].id, role: 'accessory' }),
  },
  {
    route: 'DELETE /sessions/:id/sets/:setId', label: "a set of lifter A's, with a video", allow: ['lifterA'], ok: 204,
    prepare: async (w) => w.freshVideo(),
    url: (_w, c) => `/api/sessions/${c.sessionId}/sets/${c.setId}`,
  },
  {
    route: 'POST /sets/:setId/video', label: "a set of lifter A's", allow: ['lifterA'], ok: 201, video: true,
    prepare: async (w) => w.freshSet(),
    url: (_w, c) => `/api/sets/${c.setId}/video`,
  },
  {
    route: 'DELETE /uploads/:id', label: "a video of lifter A's", allow: ['lifterA'], ok: 204,
    prepare: async (w) => w.freshVideo(),
    url: (_w, c) => `/api/uploads/${c.videoId}`,
  },
  {
    route: 'POST /sessions/:id/start-estimate', label: "lifter A's session in progress", allow: ['lifterA'],
    prepare: async (w) => {
      const session = await w.running()
      const set = session.sets.find((s) => s.kind !== 'warmup')!
      return { id: session.id, exerciseId: set.exerciseId, slotId: set.slotId }
    },
    url: (_w, c) => `/api/sessions/${c.id}/start-estimate`,
    body: (_w, _a, c) => ({ exerciseId: c.exerciseId, slotId: c.slotId, loadKg: 40, reps: 8 }),
    check: (_w, _a, res) => expect(res.body.session.sets.length).toBeGreaterThan(0),
  },
  {
    route: 'POST /sessions/:id/complete', label: "lifter A's session in progress", allow: ['lifterA'],
    prepare: async (w) => ({ id: (await w.running()).id }),
    url: (_w, c) => `/api/sessions/${c.id}/complete`,
    body: (w) => ({ completedAt: new Date().toISOString(), note: closingNote(w.tag) }),
  },
  {
    route: 'POST /sessions/:id/next-steps', label: "lifter A's finished session", allow: ['lifterA', 'coachA'],
    prepare: async (w) => {
      const report = (await w.ok<{ report: SessionReport }>('lifterA', 'get', `/api/sessions/${w.finishedId}/report`, 200)).report
      const withStep = report.exercises.find((e) => e.nextStep)
      if (!withStep?.nextStep) throw new Error('the finished session has no next step')
      return { steps: [{ exerciseId: withStep.exerciseId, slotId: withStep.slotId, option: 'next_step', targetLoadKg: withStep.nextStep.targetLoadKg, targetReps: withStep.nextStep.targetReps }] }
    },
    url: (w) => `/api/sessions/${w.finishedId}/next-steps`,
    body: (_w, _a, c) => ({ steps: c.steps }),
  },
  {
    route: 'POST /sessions/:id/comments', label: "lifter A's finished session", allow: ['lifterA', 'coachA'], ok: 201,
    url: (w) => `/api/sessions/${w.finishedId}/comments`, body: (_w, actor) => ({ body: `Matrix comment by ${actor}` }),
  },
  { route: 'POST /sessions/:id/reviewed', label: "lifter A's session waiting for review", allow: ['coachA'], url: (w) => `/api/sessions/${w.waitingId}/reviewed` },

  // ---- Plans: coach A's (lifter A is on it) and lifter A's own ----
  ...PLANS.flatMap((p): Variant[] => [
    {
      route: 'PUT /plans/:id', label: p.label, allow: [p.owner],
      prepare: async (w) => ({ body: planAsInput(await planOf(w, p.owner, p.id(w))) }),
      url: (w) => `/api/plans/${p.id(w)}`, body: (_w, _a, c) => c.body,
    },
    {
      route: 'PATCH /plans/:id', label: p.label, allow: [p.owner],
      prepare: async (w) => ({ name: (await planOf(w, p.owner, p.id(w))).name }),
      url: (w) => `/api/plans/${p.id(w)}`, body: (_w, _a, c) => ({ name: c.name }),
    },
    // plan.service: only a plan's author duplicates it (an athlete on it reads it, nothing more).
    { route: 'POST /plans/:id/duplicate', label: p.label, allow: [p.owner], ok: 201, url: (w) => `/api/plans/${p.id(w)}/duplicate` },
    {
      route: 'POST /plans/:id/rotation-proposal', label: p.label, allow: [p.owner], url: (w) => `/api/plans/${p.id(w)}/rotation-proposal`,
      body: (w) => ({ dayId: (p.owner === 'coachA' ? w.plan : w.ownPlan).days[0].id, version: 'I' }),
    },
    {
      route: 'POST /plans/:id/rotation', label: p.label, allow: [p.owner],
      prepare: async (w) => {
        const dayId = (p.owner === 'coachA' ? w.plan : w.ownPlan).days[0].id
        const proposal = (await w.ok<{ proposal: RotationProposal }>(p.owner, 'post', `/api/plans/${p.id(w)}/rotation-proposal`, 200, { dayId, version: 'I' })).proposal
        if (proposal.swaps.length === 0) throw new Error('the rotation proposal is empty')
        return { body: { dayId, version: 'I', swaps: proposal.swaps.slice(0, 1).map((s) => ({ slotId: s.slotId, toExerciseId: s.toExerciseId })) } }
      },
      url: (w) => `/api/plans/${p.id(w)}/rotation`, body: (_w, _a, c) => c.body,
    },
  ]),
  // Assigning lifter A's own plan would take lifter A off coach A's plan, so only coach A's is assigned here.
  {
    route: 'POST /plans/:id/assignments', label: PLANS[0].label, allow: ['coachA'], ok: 201, url: (w) => `/api/plans/${w.plan.id}/assignments`,
    body: (w) => ({ athleteIds: [A(w).id], startDate: today() }),
  },
  {
    route: 'DELETE /athletes/:id', label: 'lifter A (coached by coach A)', allow: ['coachA'], ok: 204, url: (w) => `/api/athletes/${A(w).id}`,
    // Coach A invites lifter A again, so the rest of the matrix keeps its world.
    after: async (w) => w.link('coachA', 'lifterA'),
  },
]

// ---- The router's own list ----
const ROUTER_KEYS = new Set(listRoutes(apiRouter({ rateLimitAuth: 10_000 } as AppConfig)).map((r) => `${r.method} ${r.path}`))
const MAIN = TABLE.filter((v) => !v.last)
const LAST = TABLE.filter((v) => v.last)

function outcomeOf(v: Variant, actor: ActorName): Outcome {
  if (v.allow.includes(actor)) return 'allow'
  return v.other?.statuses[actor] ?? 'deny'
}

/** Refused actors first, so an allowed (perhaps destructive) request comes last. */
function casesOf(v: Variant): Array<[ActorName, string]> {
  const rank = (o: Outcome) => (o === 'allow' ? 2 : o === 'deny' ? 0 : 1)
  return [...ACTORS]
    .sort((a, b) => rank(outcomeOf(v, a)) - rank(outcomeOf(v, b)))
    .map((a) => [a, String(outcomeOf(v, a))])
}

/**
 * What this actor must never see: for outsiders (anonymous, lifter B, coach B) lifter A's and
 * coach A's data; for lifter A coach A's invitations; for lifter A and coach A, lifter B's and
 * coach B's data. The admin may see everyone's.
 */
function forbiddenFor(w: AccessWorld, actor: ActorName, exempt: string[] = []) {
  const a = w.accounts
  let markers: string[] = []
  let ids: number[] = []
  if (actor === 'anonymous' || actor === 'lifterB' || actor === 'coachB') {
    markers = [...w.markers.lifterA, ...w.markers.coachA, ...w.markers.invitation]
    ids = [a.lifterA.id, a.coachA.id]
  }
  if (actor === 'anonymous' || actor === 'lifterA' || actor === 'coachA') {
    markers = [...markers, ...w.markers.b]
    ids = [...ids, a.lifterB.id, a.coachB.id]
  }
  if (actor === 'lifterA') markers = [...markers, ...w.markers.invitation]
  return { markers: markers.filter((m) => !exempt.includes(m)), ids }
}

/** Ids of forbidden people in fields that name an owner, anywhere in a JSON answer. */
function ownerIdsIn(value: unknown, ids: number[], path = '$'): string[] {
  if (Array.isArray(value)) return value.flatMap((x, i) => ownerIdsIn(x, ids, `${path}[${i}]`))
  if (value === null || typeof value !== 'object') return []
  return Object.entries(value).flatMap(([k, x]) => {
    const own = ['athleteId', 'ownerId', 'authorId', 'coachId', 'userId'].includes(k) || (k === 'id' && /\.(athlete|author|owner|coach)$/.test(path))
    return [...(own && typeof x === 'number' && ids.includes(x) ? [`${path}.${k}=${x}`] : []), ...ownerIdsIn(x, ids, `${path}.${k}`)]
  })
}

function leaksIn(w: AccessWorld, actor: ActorName, res: Response, exempt: string[] = []) {
  const { markers, ids } = forbiddenFor(w, actor, exempt)
  const text = typeof res.text === 'string' ? res.text : ''
  return [...markers.filter((m) => text.includes(m)), ...ownerIdsIn(res.body, ids)]
}

async function runCase(w: AccessWorld, v: Variant, actor: ActorName) {
  const ctx = v.prepare ? await v.prepare(w, actor) : {}
  const url = await v.url(w, ctx)
  const body = v.body ? v.body(w, actor, ctx) : undefined
  const outcome = outcomeOf(v, actor)
  const before = outcome === 'allow' ? null : await snapshotDb(w.t.sequelize)
  const method = v.route.split(' ')[0].toLowerCase() as 'get'
  const res = await w.req(actor, method, url, body, v.video ? fakeVideo : undefined)
  const documented = outcome === 'allow' ? '' : outcome === 'deny' ? (v.denyAs?.statuses[actor] ? v.denyAs.why : '') : (v.other?.why ?? '')
  const where = `${actor} ${v.route} (${v.label}) answered ${res.status}: ${(res.text ?? '').slice(0, 300)}${documented ? `\n(documented: ${documented})` : ''}`
  if (outcome === 'allow') {
    const ok = [v.ok ?? 200].flat()
    expect(ok, where).toContain(res.status)
  } else if (outcome === 'deny') {
    const refusals = v.denyAs?.statuses[actor] ?? (actor === 'anonymous' ? [401] : [403, 404])
    expect(refusals, where).toContain(res.status)
  } else {
    expect(res.status, where).toBe(outcome)
  }
  if (before) expect(changedTables(before, await snapshotDb(w.t.sequelize)), `${where}\nA refused request changed the database`).toEqual([])
  expect(leaksIn(w, actor, res, v.exempt?.markers(w)), `${where}\nThe answer carries data that is not the caller's`).toEqual([])
  if (outcome === 'allow') {
    await v.check?.(w, actor, res, ctx, body)
    await v.after?.(w, actor, res, ctx)
  }
}

const fakeVideo = fakeMp4()
let t: TestApp
let world: AccessWorld

beforeAll(async () => {
  t = await createTestApp()
  world = await AccessWorld.build(t)
}, 60_000)
afterAll(async () => {
  await t?.close()
})

describe('the policy table', () => {
  it('has an entry for every route of the API router, and no entry without a route', () => {
    expect(ROUTER_KEYS.size).toBeGreaterThan(40)
    const inTable = new Set(TABLE.map((v) => v.route))
    expect([...ROUTER_KEYS].filter((k) => !inTable.has(k)), 'routes of the router with no entry in the access table').toEqual([])
    expect([...inTable].filter((k) => !ROUTER_KEYS.has(k)), 'entries of the access table with no route in the router').toEqual([])
  })

  it('finds no /api route outside the API router but the development outbox, which goes when a real SMTP server is set', () => {
    const outside = (app: ReturnType<typeof createApp>) =>
      listRoutes((app as unknown as { router: Parameters<typeof listRoutes>[0] }).router)
        .map((r) => `${r.method} ${r.path}`)
        .filter((k) => k.split(' ')[1].startsWith('/api/'))
    expect(outside(t.app)).toEqual(['GET /api/dev/outbox'])
    const withSmtp = createApp({ ...t.config, mail: { ...t.config.mail, smtp: { host: '127.0.0.1', port: 2525, secure: false } } }, { mailer: t.mailer })
    expect(outside(withSmtp)).toEqual([])
  })
})

describe.each(MAIN)('$route · $label', (v) => {
  it.each(casesOf(v))('%s: %s', async (actor) => {
    await runCase(world, v, actor)
  })
})

/**
 * Requests on one's own objects that name lifter A's or coach A's objects inside them (in the
 * body or the query): refused, nothing changes, nothing of theirs comes back.
 */
interface CrossProbe {
  label: string
  actor: SignedIn
  method: 'get' | 'post' | 'put' | 'delete'
  url: (w: AccessWorld) => string | Promise<string>
  body?: (w: AccessWorld) => unknown | Promise<unknown>
  /** The statuses it may answer: refusals, or for a control the success. */
  answers: number[]
  /** Why a refusal other than 400/403/404 is right. */
  why?: string
  /** A control: the request is one the caller may make (so the refusals above are not a blanket no). */
  allowed?: boolean
}
const CROSS: CrossProbe[] = [
  {
    label: "control: lifter A adds coach A's own exercise to lifter A's session (their coach's exercise is theirs to use)",
    actor: 'lifterA', method: 'post', answers: [200], allowed: true,
    url: async (w) => `/api/sessions/${(await w.running()).id}/exercises`, body: (w) => ({ exerciseId: w.custom.id, role: 'accessory' }),
  },
  {
    label: "lifter B adds coach A's own exercise to lifter B's session", actor: 'lifterB', method: 'post', answers: [400, 404],
    url: (w) => `/api/sessions/${w.b.runningId}/exercises`, body: (w) => ({ exerciseId: w.custom.id, role: 'accessory' }),
  },
  {
    label: "lifter B swaps an exercise of lifter B's session for coach A's own exercise", actor: 'lifterB', method: 'post', answers: [400, 404],
    url: (w) => `/api/sessions/${w.b.runningId}/swap`, body: (w) => ({ exerciseId: w.b.exerciseId, slotId: null, toExerciseId: w.custom.id }),
  },
  {
    label: "lifter B logs a set of coach A's own exercise in lifter B's session", actor: 'lifterB', method: 'put', answers: [400, 404],
    url: (w) => `/api/sessions/${w.b.runningId}/sets/6f1e2d3c-4b5a-4978-8a1b-2c3d4e5f6a7b`,
    body: (w) => {
      const now = new Date().toISOString()
      return {
        exerciseId: w.custom.id, slotId: null, position: 5000, kind: 'straight', targetLoadKg: null, targetRepsMin: null, targetRepsMax: null,
        toFailure: false, targetRir: null, loadKg: 20, reps: 10, rir: 2, failure: false, skipped: false, note: null, loggedAt: now, editedAt: now,
      }
    },
  },
  {
    label: "lifter B writes lifter A's set id through lifter B's own session", actor: 'lifterB', method: 'put', answers: [404, 409],
    why: 'run.service answers 409 set_elsewhere for a set id that belongs to another session; nothing is written',
    url: (w) => `/api/sessions/${w.b.runningId}/sets/${w.videoSetId}`,
    body: (w) => {
      const now = new Date().toISOString()
      return {
        exerciseId: w.b.exerciseId, slotId: null, position: 5001, kind: 'straight', targetLoadKg: null, targetRepsMin: null, targetRepsMax: null,
        toFailure: false, targetRir: null, loadKg: 1, reps: 1, rir: null, failure: false, skipped: false, note: null, loggedAt: now, editedAt: now,
      }
    },
  },
  {
    label: "lifter B deletes lifter A's set through lifter B's own session", actor: 'lifterB', method: 'delete', answers: [404],
    url: (w) => `/api/sessions/${w.b.runningId}/sets/${w.videoSetId}`,
  },
  {
    label: "lifter B comments on lifter A's set through lifter B's finished session", actor: 'lifterB', method: 'post', answers: [400, 404],
    url: (w) => `/api/sessions/${w.b.finishedId}/comments`, body: (w) => ({ body: 'Nice set', setLogId: w.videoSetId }),
  },
  {
    label: "lifter B takes a next step for coach A's exercise and plan slot in lifter B's finished session", actor: 'lifterB', method: 'post', answers: [400, 404],
    url: (w) => `/api/sessions/${w.b.finishedId}/next-steps`,
    body: (w) => ({ steps: [{ exerciseId: w.custom.id, slotId: w.plan.days[0].versions.I[1].id, targetLoadKg: 20, targetReps: 10, edited: false }] }),
  },
  {
    label: "lifter B imports a logbook mapped onto coach A's own exercise", actor: 'lifterB', method: 'post', answers: [400],
    url: () => '/api/logbook/import',
    body: (w) => ({ csv: 'date,exercise,load,reps\n2025-04-01,Mystery press,30,8\n', unit: 'kg', exerciseMap: { 'Mystery press': w.custom.id } }),
  },
  {
    label: "coach B builds a plan with coach A's own exercise", actor: 'coachB', method: 'post', answers: [400],
    url: () => '/api/plans',
    body: (w) => ({ name: 'Borrowed', days: [{ name: 'X', isRest: false, versions: { I: [slot(w.custom, 'accessory')], II: [slot(w.custom, 'accessory')] } }] }),
  },
  {
    label: "coach B rewrites coach B's plan with the day and slot ids of coach A's plan", actor: 'coachB', method: 'put', answers: [400, 404],
    url: (w) => `/api/plans/${w.b.planId}`,
    body: (w) => {
      const input = planAsInput(w.plan)
      return { ...input, name: 'Taken over', days: input.days.map((d) => ({ ...d, versions: { I: d.versions.I.map((s) => ({ ...s, exerciseId: w.libraryOf('squat')[0].id })), II: d.versions.II.map((s) => ({ ...s, exerciseId: w.libraryOf('squat')[1].id })) } })) }
    },
  },
  {
    label: "coach B assigns coach B's plan to lifter A", actor: 'coachB', method: 'post', answers: [403, 404],
    url: (w) => `/api/plans/${w.b.planId}/assignments`, body: (w) => ({ athleteIds: [w.accounts.lifterA.id], startDate: today() }),
  },
  {
    label: "coach B rotates coach B's plan onto coach A's own exercise", actor: 'coachB', method: 'post', answers: [400],
    url: (w) => `/api/plans/${w.b.planId}/rotation`,
    body: async (w) => {
      const plan = await planOf(w, 'coachB', w.b.planId)
      return { dayId: plan.days[0].id, version: 'I', swaps: [{ slotId: plan.days[0].versions.I[0].id, toExerciseId: w.custom.id }] }
    },
  },
  {
    label: "lifter A's coach (coach A) assigns coach A's plan to lifter B", actor: 'coachA', method: 'post', answers: [403, 404],
    url: (w) => `/api/plans/${w.plan.id}/assignments`, body: (w) => ({ athleteIds: [w.accounts.lifterB.id], startDate: today() }),
  },
]

describe('requests on one\'s own objects that name lifter A\'s or coach A\'s objects', () => {
  it.each(CROSS.map((c) => [c.label, c] as const))('%s', async (_label, c) => {
    const w = world
    const url = await c.url(w)
    const body = c.body ? await c.body(w) : undefined
    const before = await snapshotDb(t.sequelize)
    const res = await w.req(c.actor, c.method, url, body)
    const where = `${c.label} answered ${res.status}: ${(res.text ?? '').slice(0, 300)}`
    expect(c.answers, where).toContain(res.status)
    if (!c.allowed) expect(changedTables(before, await snapshotDb(t.sequelize)), `${where}\nA refused request changed the database`).toEqual([])
    expect(leaksIn(w, c.actor, res), `${where}\nThe answer carries data that is not the caller's`).toEqual([])
  })
})

/**
 * Routes that end the caller's account run last, when the rest of the matrix is done with the
 * world: the refused actor first, the owner last, and after each deletion lifter A's sessions
 * are all still there (until lifter A deletes their own account).
 */
describe.each(LAST)('$route · $label (last: it ends accounts)', (v) => {
  let sessionsOfA = 0
  beforeAll(async () => {
    sessionsOfA = await SessionModel.count({ where: { athleteId: world.accounts.lifterA.id } })
    expect(sessionsOfA).toBeGreaterThanOrEqual(3)
  })

  const order: ActorName[] = ['anonymous', 'lifterB', 'coachB', 'admin', 'coachA', 'lifterA']
  it.each(order.map((a) => [a, String(outcomeOf(v, a))] as [ActorName, string]))('%s: %s', async (actor) => {
    await runCase(world, v, actor)
    if (outcomeOf(v, actor) !== 'allow') return
    // The account is gone: its token no longer works.
    expect((await world.req(actor, 'get', '/api/me')).status).toBe(401)
    const left = await SessionModel.count({ where: { athleteId: world.accounts.lifterA.id } })
    expect(left).toBe(actor === 'lifterA' ? 0 : sessionsOfA)
  })
})
