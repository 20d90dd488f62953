import { randomUUID } from 'node:crypto'
import fc from 'fast-check'
import { QueryTypes } from 'sequelize'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SetLogModel } from '../../server/db'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { seedDemo } from '../../server/db/seed/demo'
import { asStoredDate, UPSERT_OWN_SET } from '../../server/db/set-log-upsert'
import type { RunSession, RunSet } from '../../shared/schemas/run.schema'
import { createTestApp, type TestApp } from '../helpers/test-app'

/**
 * The one-statement set log (server/db/set-log-upsert.ts) must store exactly what the general
 * path (a Sequelize transaction) stores, in the same text forms, and keep its rules: the later
 * edit wins whatever the arrival order, and nobody writes into someone else's session.
 */
let t: TestApp
let ana: { Authorization: string }
let ben: { Authorization: string }
let session: RunSession
const TODAY = { date: '2026-12-01', tzOffset: 0 }

async function signIn(email: string) {
  const res = await request(t.app).post('/api/auth/sign-in').send({ email, password: DEMO_PASSWORD })
  return { Authorization: `Bearer ${res.body.token}` }
}

function body(set: RunSet, changes: Record<string, unknown> = {}) {
  return {
    exerciseId: set.exerciseId, slotId: set.slotId, position: set.position, kind: set.kind,
    targetLoadKg: set.targetLoadKg, targetRepsMin: set.targetRepsMin, targetRepsMax: set.targetRepsMax,
    targetReps: set.targetReps, toFailure: set.toFailure, targetRir: set.targetRir,
    loadKg: set.targetLoadKg, reps: set.targetReps ?? set.targetRepsMin, rir: 2, failure: false,
    skipped: false, note: null, loggedAt: new Date().toISOString(), editedAt: new Date().toISOString(),
    ...changes,
  }
}

const put = (id: string, payload: object, who = ana) =>
  request(t.app).put(`/api/sessions/${session.id}/sets/${id}`).set(who).send(payload)

async function rawRow(id: string) {
  const rows = await SetLogModel.sequelize!.query<Record<string, unknown>>('SELECT * FROM set_logs WHERE id = $id', {
    bind: { id }, type: QueryTypes.SELECT,
  })
  return rows[0]
}

beforeAll(async () => {
  t = await createTestApp()
  await seedDemo(t.config, new Date('2026-11-30T20:00:00Z'))
  ana = await signIn(DEMO_ACCOUNTS.lifterKg.email)
  ben = await signIn(DEMO_ACCOUNTS.lifterLb.email)
  session = (await request(t.app).post('/api/sessions').query(TODAY).set(ana).send({})).body.session
})
afterAll(async () => {
  await t.close()
})

describe('the one-statement set log', () => {
  it('writes dates in the same text form as Sequelize, so they read back as the same instants', async () => {
    const backoff = session.sets.find((s) => s.kind === 'backoff')!
    const loggedAt = '2026-12-01T17:05:09.007Z'
    const editedAt = '2026-12-01T17:05:10.250Z'
    const res = await put(backoff.id, body(backoff, { loggedAt, editedAt, note: 'grip slipped' }))
    expect(res.status).toBe(200)
    expect(res.body.set).toMatchObject({ id: backoff.id, loggedAt, editedAt, note: 'grip slipped', rir: 2 })

    const row = await rawRow(backoff.id)
    // created_at was written by Sequelize when the session was planned: same form, same length.
    const sequelizeForm = /^\d{4}-\d{2}-\d{2} \d{2}:\d{2}:\d{2}\.\d{3} \+00:00$/
    expect(row.created_at).toMatch(sequelizeForm)
    expect(row.logged_at).toBe('2026-12-01 17:05:09.007 +00:00')
    expect(row.edited_at).toBe(asStoredDate(new Date(editedAt)))
    expect(row.updated_at).toMatch(sequelizeForm)

    const model = (await SetLogModel.findByPk(backoff.id))!
    expect(model.loggedAt!.toISOString()).toBe(loggedAt)
    expect(model.editedAt!.toISOString()).toBe(editedAt)
    expect(model.failure).toBe(false)
    expect(model.skipped).toBe(false)
    // The runner view reads back what the log answered.
    const view: RunSession = (await request(t.app).get(`/api/sessions/${session.id}/run`).set(ana)).body.session
    expect(view.sets.find((s) => s.id === backoff.id)).toEqual(res.body.set)
  })

  it('inserts a new set (a client-made UUID) once, however often it is retried', async () => {
    const template = session.sets.find((s) => s.kind === 'backoff')!
    const id = randomUUID()
    const payload = body(template, { kind: 'straight', position: 9_001, failure: true, rir: null })
    for (let i = 0; i < 3; i++) expect((await put(id, payload)).status).toBe(200)
    expect(await SetLogModel.count({ where: { id } })).toBe(1)
    const row = await rawRow(id)
    expect(row).toMatchObject({ session_id: session.id, kind: 'straight', position: 9_001, failure: 1, role: null })
  })

  it('keeps the later edit whatever order the edits arrive in (ties: the last to arrive)', async () => {
    const template = session.sets.find((s) => s.kind === 'backoff')!
    // Invariant of "the later edit wins" (common practice for last-writer-wins sync, no published source).
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.record({ reps: fc.integer({ min: 1, max: 30 }), offsetMs: fc.integer({ min: 0, max: 5_000 }) }), {
          minLength: 1, maxLength: 6,
        }),
        async (edits) => {
          const id = randomUUID()
          const base = Date.parse('2026-12-01T18:00:00.000Z')
          for (const e of edits) {
            const res = await put(id, body(template, { kind: 'straight', position: 9_100, reps: e.reps, editedAt: new Date(base + e.offsetMs).toISOString() }))
            expect(res.status).toBe(200)
          }
          const latest = Math.max(...edits.map((e) => e.offsetMs))
          const winner = edits.filter((e) => e.offsetMs === latest).at(-1)!
          expect((await SetLogModel.findByPk(id))!.reps).toBe(winner.reps)
        },
      ),
      { numRuns: 25 },
    )
  })

  it("refuses another lifter's session and a set of another session, changing nothing", async () => {
    const backoff = session.sets.find((s) => s.kind === 'backoff')!
    const before = await rawRow(backoff.id)
    const stranger = await put(backoff.id, body(backoff, { reps: 1, editedAt: new Date(Date.now() + 60_000).toISOString() }), ben)
    expect(stranger.status).toBe(404)
    const newId = randomUUID()
    expect((await put(newId, body(backoff, { position: 9_200 }), ben)).status).toBe(404)
    expect(await rawRow(newId)).toBeUndefined()
    expect(await rawRow(backoff.id)).toEqual(before)

    // Ben's own session, then Ana's set id sent into it: the general path answers 409.
    const bens: RunSession = (await request(t.app).post('/api/sessions').query(TODAY).set(ben).send({})).body.session
    const bensSet = bens.sets.find((s) => s.kind !== 'top')!
    const elsewhere = await request(t.app).put(`/api/sessions/${bens.id}/sets/${backoff.id}`).set(ben)
      .send(body(bensSet, { editedAt: new Date(Date.now() + 60_000).toISOString() }))
    expect(elsewhere.status).toBe(409)
    expect(await rawRow(backoff.id)).toEqual(before)
  })

  it('still lets a lifter log an exercise new to the session (the general path checks it)', async () => {
    const inSession = new Set(session.sets.map((s) => s.exerciseId))
    const library: Array<{ id: number }> = (await request(t.app).get('/api/exercises').set(ana)).body.exercises
    const fresh = library.find((e) => !inSession.has(e.id))!
    const template = session.sets.find((s) => s.kind === 'backoff')!
    const id = randomUUID()
    const res = await put(id, body(template, { exerciseId: fresh.id, slotId: null, kind: 'straight', position: 9_300 }))
    expect(res.status).toBe(200)
    expect((await SetLogModel.findByPk(id))!.exerciseId).toBe(fresh.id)
  })

  it("finds the session's sets through the session index, not by walking every set of the exercise", async () => {
    const names = [...UPSERT_OWN_SET.matchAll(/\$(\w+)/g)].map((m) => m[1])
    const bind = Object.fromEntries(names.map((n) => [n, 1]))
    const plan = await SetLogModel.sequelize!.query<{ detail: string }>(`EXPLAIN QUERY PLAN ${UPSERT_OWN_SET}`, { bind, type: QueryTypes.SELECT })
    const details = plan.map((row) => row.detail)
    expect(details.some((d) => d.includes('USING INDEX set_logs_session_id_position (session_id=?)'))).toBe(true)
    expect(details.some((d) => d.includes('set_logs_exercise_id'))).toBe(false)
    expect(details.some((d) => /^SCAN /.test(d))).toBe(false)
  })
  it("re-targets a top set's back-offs reading the session's sets through the session index, not a slot's or exercise's history", async () => {
    // Without ANALYZE statistics SQLite's planner takes any usable index; for the back-off lookup
    // it took the slot index, which walks every set ever logged in that plan slot: 45 ms a top
    // set on the large demo club, where a plan slot holds years of sets.
    const top = session.sets.find((s) => s.kind === 'top')!
    const statements: string[] = []
    const options = (SetLogModel.sequelize as unknown as { options: { logging: unknown } }).options
    const before = options.logging
    options.logging = (sql: string) => statements.push(sql.replace(/^Execut(?:ing|ed) \([^)]*\): /, ''))
    try {
      const res = await put(top.id, body(top, { reps: (top.targetRepsMin ?? 5) + 1, rir: 1 }))
      expect(res.status).toBe(200)
    } finally {
      options.logging = before
    }
    const reads = statements.filter((sql) => /^SELECT [\s\S]* FROM `?set_logs`?/.test(sql))
    expect(reads.length).toBeGreaterThan(0)
    for (const sql of reads) {
      const plan = await SetLogModel.sequelize!.query<{ detail: string }>(`EXPLAIN QUERY PLAN ${sql}`, { type: QueryTypes.SELECT })
      const onSetLogs = plan.map((row) => row.detail).filter((d) => /^(SEARCH|SCAN) /.test(d))
      expect(onSetLogs.length, sql).toBeGreaterThan(0)
      for (const detail of onSetLogs) expect(detail, sql).toMatch(/USING (INDEX set_logs_session_id_position \(session_id=\?|INDEX sqlite_autoindex_set_logs_1 \(id=\?\))/)
    }
  })
})
