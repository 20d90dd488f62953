import request from 'supertest'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SessionModel, SetLogModel, UserModel } from '../../server/db'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import { seedDemo } from '../../server/db/seed/demo'
import { MAX_IMPORT_ROWS } from '../../server/services/logbook.service'
import { bestE1rm } from '../../shared/domain/records'
import { createTestApp, type TestApp } from '../helpers/test-app'

type Actor = Awaited<ReturnType<TestApp['userWithToken']>>
let t: TestApp
let ana: { Authorization: string }
let coach: { Authorization: string }
let importer: Actor

async function signIn(email: string) {
  const res = await request(t.app).post('/api/auth/sign-in').send({ email, password: DEMO_PASSWORD })
  return { Authorization: `Bearer ${res.body.token}` }
}

/** Best estimated 1RM (Epley 1985) per exercise over a lifter's whole logbook, and rep records per load. */
async function historyOf(userId: number) {
  const sets = await SetLogModel.findAll({
    where: { skipped: false },
    include: [{ model: SessionModel, as: 'session', where: { athleteId: userId, status: 'completed' } }, 'exercise'],
  })
  const byExercise = new Map<string, Array<{ loadKg: number; reps: number }>>()
  for (const s of sets) {
    if (s.kind === 'warmup' || !s.reps || !s.loadKg) continue
    byExercise.set(s.exercise!.name, [...(byExercise.get(s.exercise!.name) ?? []), { loadKg: s.loadKg, reps: s.reps }])
  }
  return new Map([...byExercise].map(([name, list]) => [name, { e1rm: bestE1rm(list)!.e1rmKg, sets: list.length }]))
}

beforeAll(async () => {
  t = await createTestApp()
  await seedDemo(t.config, new Date('2026-11-30T20:00:00Z'))
  ana = await signIn(DEMO_ACCOUNTS.lifterKg.email)
  coach = await signIn(DEMO_ACCOUNTS.coach.email)
  importer = await t.userWithToken('lifter', 'importer')
})
afterAll(async () => {
  await t.close()
})

async function importCsv(csv: string, extra: object = {}) {
  return request(t.app).post('/api/logbook/import').set(importer.auth).send({ csv, unit: 'kg', ...extra })
}

describe('export', () => {
  it('exports the whole logbook as CSV, one row per set, and as JSON; a coach can export an athlete', async () => {
    const csv = await request(t.app).get('/api/logbook/export').set(ana)
    expect(csv.status).toBe(200)
    expect(csv.headers['content-type']).toMatch(/text\/csv/)
    expect(csv.headers['content-disposition']).toMatch(/attachment; filename="?chalkline-logbook\.csv"?/)
    const parsed = Papa.parse<Record<string, string>>(csv.text, { header: true, skipEmptyLines: true })
    expect(parsed.meta.fields).toEqual(['date', 'exercise', 'set_kind', 'load', 'unit', 'reps', 'rir', 'failure', 'note', 'day', 'version'])
    const user = (await UserModel.findOne({ where: { email: DEMO_ACCOUNTS.lifterKg.email } }))!
    const logged = await SetLogModel.count({ include: [{ model: SessionModel, as: 'session', where: { athleteId: user.id, status: 'completed' } }] })
    expect(parsed.data.length).toBe(logged)

    const json = await request(t.app).get('/api/logbook/export').query({ format: 'json' }).set(ana)
    expect(JSON.parse(json.text).sessions.length).toBeGreaterThan(10)
    const asCoach = await request(t.app).get('/api/logbook/export').query({ athleteId: user.id }).set(coach)
    expect(asCoach.text).toBe(csv.text)
  })
})

describe('import', () => {
  it("round trip: the demo lifter's export imported by another lifter gives the same records and 1RM history", async () => {
    const csv = (await request(t.app).get('/api/logbook/export').set(ana)).text
    const preview = await request(t.app).post('/api/logbook/import/preview').set(importer.auth).send({ csv, unit: 'kg' })
    expect(preview.status).toBe(200)
    expect(preview.body.preview.errorCount).toBe(0)
    expect(preview.body.preview.unknownExercises).toEqual([])

    const res = await importCsv(csv)
    expect(res.status).toBe(201)
    const source = (await UserModel.findOne({ where: { email: DEMO_ACCOUNTS.lifterKg.email } }))!
    const [before, after] = [await historyOf(source.id), await historyOf(importer.user.id)]
    expect([...after.keys()].sort()).toEqual([...before.keys()].sort())
    for (const [name, h] of before) {
      expect(after.get(name)!.sets).toBe(h.sets)
      expect(after.get(name)!.e1rm).toBeCloseTo(h.e1rm, 9)
    }

    // The same file again adds nothing.
    const again = await importCsv(csv)
    expect(again.status).toBe(201)
    expect(again.body.result).toMatchObject({ setsCreated: 0, sessionsCreated: 0 })
    expect(again.body.result.setsAlreadyThere).toBe(res.body.result.setsCreated)
  })

  it('maps columns and unknown exercise names, in pounds', async () => {
    const csv = 'Day,Lift,Weight,Reps,Notes\n2026-10-01,Barbell Bench Press,135,8,\n2026-10-01,Garage sled push,90,20,outdoor\n'
    const preview = await request(t.app).post('/api/logbook/import/preview').set(importer.auth).send({ csv, unit: 'lb' })
    expect(preview.body.preview.mapping).toMatchObject({ date: 'Day', exercise: 'Lift', load: 'Weight', reps: 'Reps', note: 'Notes' })
    expect(preview.body.preview.unknownExercises).toEqual(['Garage sled push'])
    expect(preview.body.preview.rows[1].errors[0]).toMatch(/Unknown exercise/)
    const res = await importCsv(csv, { unit: 'lb', exerciseMap: { 'Garage sled push': 'new' } })
    expect(res.status).toBe(201)
    expect(res.body.result).toMatchObject({ setsCreated: 2, exercisesCreated: 1 })
    // 135 lb = 61.23497 kg exactly (1 lb = 0.45359237 kg, NIST SP 811 / 1959 agreement).
    const bench = await SetLogModel.findOne({ where: { reps: 8, note: null }, include: [{ model: SessionModel, as: 'session', where: { athleteId: importer.user.id, startedAt: new Date('2026-10-01T12:00:00Z') } }] })
    expect(bench!.loadKg).toBeCloseTo(135 * 0.45359237, 10)
  })

  describe('bad files: a clear error and nothing written', () => {
    const cases: Array<[string, string, RegExp]> = [
      ['an empty file', '', /empty/i],
      ['wrong columns', 'name,colour\nbob,red\n', /date, exercise, load and reps/],
      ['bad dates', 'date,exercise,load,reps\n2026-13-45,Back squat,100,5\n', /not a date/],
      ['negative loads', 'date,exercise,load,reps\n2026-10-02,Back squat,-100,5\n', /cannot be negative/],
      ['a binary file named .csv', '\u0000\u0001PNG\u0000IHDR\u0000\u0000', /not a CSV/],
    ]
    for (const [what, csv, message] of cases) {
      it(`refuses ${what}`, async () => {
        const before = await SetLogModel.count()
        const res = await importCsv(csv)
        expect(res.status).toBe(400)
        expect(JSON.stringify(res.body.error)).toMatch(message)
        expect(await SetLogModel.count()).toBe(before)
      })
    }

    it(`refuses more than ${MAX_IMPORT_ROWS} rows (a 10,000-row file)`, async () => {
      const rows = Array.from({ length: 10_000 }, (_, i) => `2026-01-${String((i % 28) + 1).padStart(2, '0')},Back squat,100,${(i % 10) + 1}`)
      const before = await SetLogModel.count()
      const res = await importCsv(`date,exercise,load,reps\n${rows.join('\n')}\n`)
      expect(res.status).toBe(400)
      expect(res.body.error.message).toMatch(/10000 rows/)
      expect(await SetLogModel.count()).toBe(before)
    })

    it('writes nothing when only one row of many is bad', async () => {
      const before = await SetLogModel.count()
      const res = await importCsv('date,exercise,load,reps\n2026-09-01,Back squat,100,5\n2026-09-02,Back squat,abc,5\n')
      expect(res.status).toBe(400)
      expect(res.body.error.issues[0]).toMatchObject({ path: 'rows.3' })
      expect(await SetLogModel.count()).toBe(before)
    })
  })
})
