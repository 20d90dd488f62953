import { existsSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { openDatabase, SessionModel, SetLogModel, UploadModel } from '../../server/db'
import { backup, integrityCheck, restore } from '../../server/db/backup'
import { buildCompletedSession } from '../helpers/builders'
import { createTestApp, type TestApp } from '../helpers/test-app'

let t: TestApp
beforeAll(async () => {
  t = await createTestApp()
})
afterAll(async () => {
  await t.close()
})

describe('backup and restore', () => {
  it('copies the database and the uploads while running, and puts them back after later changes', async () => {
    const lifter = await t.userWithToken('lifter', 'kept')
    const session = await buildCompletedSession(lifter.user.id)
    const set = (await SetLogModel.findOne({ where: { sessionId: session.id } }))!
    const video = Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from('ftypisom'), Buffer.alloc(200)])
    const uploaded = await request(t.app).post(`/api/sets/${set.id}/video`).set(lifter.auth).attach('video', video, 'v.mp4')
    expect(uploaded.status).toBe(201)

    const dir = await backup(t.sequelize, t.config.uploads.dir, join(t.dir, 'backups'))
    expect(existsSync(join(dir, 'chalkline.sqlite'))).toBe(true)
    const storedVideos = readdirSync(join(dir, 'uploads'), { recursive: true }).map(String).filter((f) => f.endsWith('.mp4'))
    expect(storedVideos).toHaveLength(1)

    // Later changes that the restore must undo.
    await SessionModel.destroy({ where: { id: session.id } })
    await t.sequelize.close()

    restore(dir, t.config.databasePath, t.config.uploads.dir)
    const reopened = await openDatabase(t.config.databasePath)
    expect(await integrityCheck(reopened)).toBe('ok')
    expect(await SessionModel.findByPk(session.id)).not.toBeNull()
    const upload = (await UploadModel.findByPk(uploaded.body.video.id))!
    expect(readdirSync(t.config.uploads.dir, { recursive: true }).map(String).some((f) => f.endsWith(upload.storageKey))).toBe(true)
    await reopened.close()
  })
})
