import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { QueryTypes } from 'sequelize'
import { EquipmentProfileModel, UserModel } from '../../server/db'
import { createMigrator } from '../../server/db/migrate'
import { gymOf } from '../../server/services/session-planning.service'
import { KG_COMPETITION_SET, minimumLoad } from '../../shared/domain/equipment'
import { KG_GYM, LB_GYM, equipmentFor, loadRangeOf, type GymProfile } from '../../shared/domain/gym'
import { createTestApp, type TestApp } from '../helpers/test-app'

type Actor = Awaited<ReturnType<TestApp['userWithToken']>>
let t: TestApp
let lifter: Actor
let otherLifter: Actor
let coach: Actor
let otherCoach: Actor
let admin: Actor

beforeAll(async () => {
  t = await createTestApp()
  lifter = await t.userWithToken('lifter', 'gym-lifter')
  otherLifter = await t.userWithToken('lifter', 'gym-other-lifter')
  coach = await t.userWithToken('coach', 'gym-coach')
  otherCoach = await t.userWithToken('coach', 'gym-other-coach')
  admin = await t.userWithToken('admin', 'gym-admin')
  await t.linkCoach(coach.user.id, lifter.user.id)
  await t.linkCoach(otherCoach.user.id, otherLifter.user.id)
})
afterAll(async () => {
  await t.close()
})

/** A copy of a preset to edit (the presets share nothing once copied). */
const copyOf = (gym: GymProfile): GymProfile => JSON.parse(JSON.stringify(gym))
const storedRows = (userId: number) => EquipmentProfileModel.findAll({ where: { userId } })
const issuesOf = (res: request.Response) => res.body.error.issues as Array<{ path: string; message: string }>

describe('GET /api/me/gym', () => {
  it("answers the preset of the lifter's unit while nothing is stored, and stores nothing", async () => {
    const kg = await request(t.app).get('/api/me/gym').set(lifter.auth)
    expect(kg.status).toBe(200)
    expect(kg.body).toEqual({ gym: JSON.parse(JSON.stringify(KG_GYM)), savedAt: null })

    const lbLifter = await t.userWithToken('lifter', 'gym-lb-lifter')
    await UserModel.update({ unit: 'lb' }, { where: { id: lbLifter.user.id } })
    const lb = await request(t.app).get('/api/me/gym').set(lbLifter.auth)
    expect(lb.body.savedAt).toBeNull()
    expect(lb.body.gym.barbell).toMatchObject({ unit: 'lb', barMass: 45, collarMass: 0 })
    expect(lb.body.gym.sled).toMatchObject({ unit: 'lb', barMass: LB_GYM.sled.barMass })

    expect(await storedRows(lifter.user.id)).toHaveLength(0)
    expect(await storedRows(lbLifter.user.id)).toHaveLength(0)
  })

  it('reads a row stored before the gym editor (no sled, collars only as collarMass) with the gaps filled', async () => {
    const older = await t.userWithToken('lifter', 'gym-older-row')
    const { sled: _sled, ...withoutSled } = copyOf(KG_GYM)
    const { collars: _collars, ...bar } = KG_COMPETITION_SET as typeof KG_COMPETITION_SET & { collars?: unknown }
    await EquipmentProfileModel.create({ userId: older.user.id, name: 'Kilogram gym', spec: { ...withoutSled, barbell: bar }, isDefault: true })

    const res = await request(t.app).get('/api/me/gym').set(older.auth)

    expect(res.status).toBe(200)
    expect(res.body.savedAt).toEqual(expect.any(String))
    // IWF competition collars are 2.5 kg each and counted (IWF Technical and Competition Rules).
    expect(res.body.gym.barbell.collars).toEqual({ counted: true, mass: 2.5 })
    expect(res.body.gym.barbell.collarMass).toBe(2.5)
    expect(res.body.gym.sled).toMatchObject({ kind: 'barbell', unit: 'kg', barMass: 50, collarMass: 0 })
  })
})

describe('PUT /api/me/gym', () => {
  it('stores the gym with collarMass derived from the collars, and the engine loads with it', async () => {
    const body = copyOf(KG_GYM)
    body.barbell.barMass = 15
    body.barbell.collars = { counted: true, mass: 2.5 }
    body.barbell.collarMass = 0 // stale on purpose: the server derives it
    body.barbell.plates.push({ mass: 0.25, count: 2 })
    body.sled.barMass = 62.5

    const res = await request(t.app).put('/api/me/gym').set(lifter.auth).send(body)

    expect(res.status).toBe(200)
    expect(res.body.savedAt).toEqual(expect.any(String))
    expect(res.body.gym.barbell).toMatchObject({ barMass: 15, collarMass: 2.5, collars: { counted: true, mass: 2.5 } })
    const rows = await storedRows(lifter.user.id)
    expect(rows).toHaveLength(1)
    expect(rows[0].isDefault).toBe(true)
    const spec = rows[0].spec as GymProfile
    expect(spec.barbell).toEqual({
      kind: 'barbell', unit: 'kg', barMass: 15, collarMass: 2.5, collars: { counted: true, mass: 2.5 }, plates: body.barbell.plates,
    })
    expect(spec.sled).toEqual({ kind: 'barbell', unit: 'kg', barMass: 62.5, collarMass: 0, plates: KG_GYM.sled.plates })

    const gym = await gymOf((await UserModel.findByPk(lifter.user.id))!)
    // Empty bar with collars counted: 15 + 2 x 2.5 = 20 kg (IWF: collars count in the total).
    expect(minimumLoad(gym.barbell).load).toBe(20)
    // A pair of 0.25 kg plates, one a side, is the smallest step: 0.5 kg (arithmetic).
    expect(loadRangeOf(equipmentFor(gym, 'barbell')).smallestStep).toBe(0.5)
    expect(equipmentFor(gym, 'sled')).toMatchObject({ barMass: 62.5 })
  })

  it('updates the same row on the next save and says when it was saved', async () => {
    const body = copyOf(KG_GYM)
    body.dumbbell.pairs = [5, 7.5, 10, 12.5]
    const res = await request(t.app).put('/api/me/gym').set(lifter.auth).send(body)
    expect(res.status).toBe(200)
    const rows = await storedRows(lifter.user.id)
    expect(rows).toHaveLength(1)
    expect((rows[0].spec as GymProfile).dumbbell.pairs).toEqual([5, 7.5, 10, 12.5])
    expect(res.body.savedAt).toBe(rows[0].updatedAt.toISOString())

    const read = await request(t.app).get('/api/me/gym').set(lifter.auth)
    expect(read.body).toEqual(res.body)
  })

  it('takes a pound gym with 1.25 lb microloading plates', async () => {
    const lbLifter = await t.userWithToken('lifter', 'gym-lb-saver')
    const body = copyOf(LB_GYM)
    body.barbell.plates.push({ mass: 1.25, count: 2 })
    const res = await request(t.app).put('/api/me/gym').set(lbLifter.auth).send(body)
    expect(res.status).toBe(200)
    // 2 x 1.25 lb: a 2.5 lb step on the bar (arithmetic).
    expect(loadRangeOf(res.body.gym.barbell).smallestStep).toBe(2.5)
  })
})

describe('bad input', () => {
  const cases: Array<[string, (gym: GymProfile) => void, string, string]> = [
    ['a bar of 500 kg', (g) => { g.barbell.barMass = 500 }, 'barbell.barMass', 'A bar weighs 1 to 50 kg'],
    ['counted collars of no mass', (g) => { g.barbell.collars = { counted: true, mass: 0 } }, 'barbell.collars.mass', 'One collar weighs more than 0 and at most 5 kg'],
    ['a plate of 0.33 kg', (g) => { g.barbell.plates[0].mass = 0.33 }, 'barbell.plates.0.mass', 'Use steps of 0.05 kg (for example 1.25)'],
    ['a plate size listed twice', (g) => { g.barbell.plates[1].mass = 25 }, 'barbell.plates.1.mass', '25 kg is listed twice'],
    ['no pair of a plate size', (g) => { g.barbell.plates[0].count = 0 }, 'barbell.plates.0.count', 'At least 1; remove the plate if there is none'],
    ['no plates at all', (g) => { g.sled.plates = [] }, 'sled.plates', 'Add at least one plate size'],
    ['a dumbbell typed as words', (g) => { (g.dumbbell.pairs as unknown[])[0] = 'ten' }, 'dumbbell.pairs.0', "Enter each dumbbell's mass in numbers"],
    ['a negative pin setting', (g) => { g.stack.steps[0] = -5 }, 'stack.steps.0', 'Pin settings weigh 0 to 500 kg'],
    ['a sled of 300 kg', (g) => { g.sled.barMass = 300 }, 'sled.barMass', 'A sled weighs 0 to 250 kg'],
    ['1000 kg of plates a side', (g) => { g.barbell.plates = [{ mass: 50, count: 20 }] }, 'barbell.plates', 'More than 500 kg of plates a side: keep the plates you really use'],
    ['a pound bar of 120 lb', (g) => { Object.assign(g, copyOf(LB_GYM)); g.barbell.barMass = 120 }, 'barbell.barMass', 'A bar weighs 2 to 110 lb'],
  ]

  it.each(cases)('refuses %s with a message on the field and stores nothing', async (_label, spoil, path, message) => {
    const before = (await storedRows(lifter.user.id)).map((r) => JSON.stringify(r.spec))
    const body = copyOf(KG_GYM)
    spoil(body)
    const res = await request(t.app).put('/api/me/gym').set(lifter.auth).send(body)
    expect(res.status).toBe(400)
    expect(issuesOf(res)).toEqual([{ path, message }])
    expect((await storedRows(lifter.user.id)).map((r) => JSON.stringify(r.spec))).toEqual(before)
  })
})

describe('GET and PUT /api/athletes/:id/gym', () => {
  it("lets the athlete's coach read and save the athlete's gym, stored under the athlete", async () => {
    const read = await request(t.app).get(`/api/athletes/${lifter.user.id}/gym`).set(coach.auth)
    expect(read.status).toBe(200)
    expect(read.body).toEqual((await request(t.app).get('/api/me/gym').set(lifter.auth)).body)

    const body = copyOf(KG_GYM)
    body.barbell.barMass = 10
    const saved = await request(t.app).put(`/api/athletes/${lifter.user.id}/gym`).set(coach.auth).send(body)
    expect(saved.status).toBe(200)
    expect(await storedRows(coach.user.id)).toHaveLength(0)
    const rows = await storedRows(lifter.user.id)
    expect(rows).toHaveLength(1)
    expect((rows[0].spec as GymProfile).barbell.barMass).toBe(10)
    expect((await request(t.app).get('/api/me/gym').set(lifter.auth)).body.gym.barbell.barMass).toBe(10)
  })

  it('refuses another coach, another lifter, the athlete themself and an admin, and changes nothing', async () => {
    const before = (await EquipmentProfileModel.findAll({ order: [['id', 'ASC']] })).map((r) => JSON.stringify(r.toJSON()))
    const url = `/api/athletes/${lifter.user.id}/gym`
    const body = copyOf(KG_GYM)
    for (const [who, status] of [[otherCoach, 404], [otherLifter, 403], [lifter, 403], [admin, 403]] as const) {
      expect((await request(t.app).get(url).set(who.auth)).status).toBe(status)
      expect((await request(t.app).put(url).set(who.auth).send(body)).status).toBe(status)
    }
    expect((await request(t.app).get(url)).status).toBe(401)
    // An unknown athlete reads as someone else's.
    expect((await request(t.app).get('/api/athletes/999999/gym').set(coach.auth)).status).toBe(404)
    // /me/gym is a lifter's own: a coach has none there.
    expect((await request(t.app).put('/api/me/gym').set(coach.auth).send(body)).status).toBe(403)
    expect((await EquipmentProfileModel.findAll({ order: [['id', 'ASC']] })).map((r) => JSON.stringify(r.toJSON()))).toEqual(before)
  })
})

describe('migration 0006: the library loads the leg press and hack squat on a sled', () => {
  it("moves the library's rows to 'sled' and leaves a coach's own exercise alone, both ways", async () => {
    const migrator = createMigrator(t.sequelize)
    await migrator.down({ to: '0006-sled-exercises' })
    // Rows as the schema was before 0006, written without the model (later migrations add columns).
    const row = (name: string, ownerId: number | null) => ({
      owner_id: ownerId, name, pattern: 'squat', primary_muscles: '["quads"]', secondary_muscles: '[]',
      equipment_kind: 'machine', load_step_kg: 5, default_rest_sec: 120, created_at: new Date(), updated_at: new Date(),
    })
    await t.sequelize.getQueryInterface().bulkInsert('exercises', [
      row('Leg press', null), row('Hack squat machine', null), row('Leg press', coach.user.id), row('Leg extension', null),
    ])
    const kinds = async () =>
      (await t.sequelize.query<{ kind: string }>(
        "SELECT equipment_kind AS kind FROM exercises WHERE name IN ('Leg press', 'Hack squat machine', 'Leg extension') ORDER BY id",
        { type: QueryTypes.SELECT },
      )).map((r) => r.kind)

    await migrator.up()
    expect(await kinds()).toEqual(['sled', 'sled', 'machine', 'machine'])

    await migrator.down({ to: '0006-sled-exercises' })
    expect(await kinds()).toEqual(['machine', 'machine', 'machine', 'machine'])
    await migrator.up()
  })
})
