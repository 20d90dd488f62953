import { existsSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SetLogModel, UploadModel } from '../../server/db'
import { buildCompletedSession } from '../helpers/builders'
import { createTestApp, TEST_PASSWORD, type TestApp } from '../helpers/test-app'

type Actor = Awaited<ReturnType<TestApp['userWithToken']>>
let t: TestApp
let lifter: Actor, other: Actor, coach: Actor

/** A minimal ISO base media file head: size, "ftyp", brand "isom" (ISO/IEC 14496-12), then filler. */
function fakeMp4(bytes = 4096) {
  const buf = Buffer.alloc(bytes)
  buf.writeUInt32BE(24, 0)
  buf.write('ftypisom', 4, 'latin1')
  for (let i = 12; i < bytes; i++) buf[i] = i % 251
  return buf
}

async function setOf(actor: Actor) {
  const session = await buildCompletedSession(actor.user.id)
  return (await SetLogModel.findOne({ where: { sessionId: session.id } }))!
}

const uploadFiles = () => {
  const dir = t.config.uploads.dir
  return existsSync(dir) ? readdirSync(dir, { recursive: true }).map(String).filter((f) => /\.(mp4|webm|mov)$/.test(f)) : []
}

beforeAll(async () => {
  t = await createTestApp({ UPLOAD_MAX_MB: '1' })
  lifter = await t.userWithToken('lifter', 'filmed')
  other = await t.userWithToken('lifter', 'nosy')
  coach = await t.userWithToken('coach', 'watcher')
  await t.linkCoach(coach.user.id, lifter.user.id)
})
afterAll(async () => {
  await t.close()
})

describe('POST /api/sets/:setId/video', () => {
  it('stores a video under a random name, checked by content, and the lifter and their coach can stream it with ranges', async () => {
    const set = await setOf(lifter)
    const video = fakeMp4()
    const res = await request(t.app).post(`/api/sets/${set.id}/video`).set(lifter.auth).attach('video', video, 'my squat PR.mp4')
    expect(res.status).toBe(201)
    expect(res.body.video).toMatchObject({ mimeType: 'video/mp4', sizeBytes: video.length })
    const stored = await UploadModel.findByPk(res.body.video.id)
    expect(stored!.storageKey).toMatch(/^[a-f0-9-]{36}\.mp4$/)
    expect(uploadFiles().some((f) => f.includes('squat'))).toBe(false)

    // The session detail names the video on its set.
    const detail = await request(t.app).get(`/api/sessions/${set.sessionId}`).set(lifter.auth)
    expect(detail.body.session.sets[0].videoId).toBe(res.body.video.id)

    const { body } = await request(t.app).get(`/api/uploads/${res.body.video.id}/url`).set(coach.auth)
    const full = await request(t.app).get(body.url).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => cb(null, Buffer.concat(chunks)))
    })
    expect(full.status).toBe(200)
    expect(Buffer.compare(full.body, video)).toBe(0)

    // RFC 9110 range request: bytes 100-199 -> 206 with exactly those bytes.
    const part = await request(t.app).get(body.url).set('Range', 'bytes=100-199').buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => cb(null, Buffer.concat(chunks)))
    })
    expect(part.status).toBe(206)
    expect(part.headers['content-range']).toBe(`bytes 100-199/${video.length}`)
    expect(Buffer.compare(part.body, video.subarray(100, 200))).toBe(0)
    const beyond = await request(t.app).get(body.url).set('Range', `bytes=${video.length + 10}-`)
    expect(beyond.status).toBe(416)
  })

  it("refuses another lifter (403) and a stream link that was not signed for it", async () => {
    const set = await setOf(lifter)
    const res = await request(t.app).post(`/api/sets/${set.id}/video`).set(lifter.auth).attach('video', fakeMp4(), 'a.mp4')
    expect((await request(t.app).get(`/api/uploads/${res.body.video.id}/url`).set(other.auth)).status).toBe(403)
    expect((await request(t.app).get(`/api/uploads/${res.body.video.id}/stream?sig=not-a-valid-signature`)).status).toBe(403)
    // Uploading to someone else's set is refused too.
    expect((await request(t.app).post(`/api/sets/${set.id}/video`).set(other.auth).attach('video', fakeMp4(), 'b.mp4')).status).toBe(404)
  })

  it('refuses a file larger than the limit with 413 and a non-video named .mp4 with 415, keeping nothing', async () => {
    const set = await setOf(lifter)
    const before = uploadFiles().length
    const big = await request(t.app).post(`/api/sets/${set.id}/video`).set(lifter.auth).attach('video', fakeMp4(1024 * 1024 + 10), 'big.mp4')
    expect(big.status).toBe(413)
    const text = await request(t.app).post(`/api/sets/${set.id}/video`).set(lifter.auth).attach('video', Buffer.from('just some text, not a video at all'), 'fake.mp4')
    expect(text.status).toBe(415)
    expect(text.body.error.code).toBe('not_a_video')
    expect(uploadFiles().length).toBe(before)
    expect(readdirSync(join(t.config.uploads.dir, 'tmp'))).toEqual([])
  })

  it('accepts WebM by its EBML signature (RFC 8794)', async () => {
    const set = await setOf(lifter)
    const webm = Buffer.concat([Buffer.from([0x1a, 0x45, 0xdf, 0xa3]), Buffer.alloc(500)])
    const res = await request(t.app).post(`/api/sets/${set.id}/video`).set(lifter.auth).attach('video', webm, 'clip.bin')
    expect(res.status).toBe(201)
    expect(res.body.video.mimeType).toBe('video/webm')
  })
})

describe('deleting', () => {
  it('deleting the set deletes its video file', async () => {
    const set = await setOf(lifter)
    const res = await request(t.app).post(`/api/sets/${set.id}/video`).set(lifter.auth).attach('video', fakeMp4(), 'x.mp4')
    const key = (await UploadModel.findByPk(res.body.video.id))!.storageKey
    expect(uploadFiles().some((f) => f.endsWith(key))).toBe(true)
    expect((await request(t.app).delete(`/api/sessions/${set.sessionId}/sets/${set.id}`).set(lifter.auth)).status).toBe(204)
    expect(uploadFiles().some((f) => f.endsWith(key))).toBe(false)
    expect(await UploadModel.findByPk(res.body.video.id)).toBeNull()
  })

  it("deleting the account deletes every one of the lifter's video files", async () => {
    const leaver = await t.userWithToken('lifter', 'leaver')
    const set = await setOf(leaver)
    const res = await request(t.app).post(`/api/sets/${set.id}/video`).set(leaver.auth).attach('video', fakeMp4(), 'y.mp4')
    const key = (await UploadModel.findByPk(res.body.video.id))!.storageKey
    expect((await request(t.app).delete('/api/me').set(leaver.auth).send({ password: 'wrong-password' })).status).toBe(401)
    expect((await request(t.app).delete('/api/me').set(leaver.auth).send({ password: TEST_PASSWORD })).status).toBe(204)
    expect(uploadFiles().some((f) => f.endsWith(key))).toBe(false)
    expect(await SetLogModel.findByPk(set.id)).toBeNull()
  })
})
