import { randomUUID } from 'node:crypto'
import { rm } from 'node:fs/promises'
import jwt from 'jsonwebtoken'
import type { AppConfig } from '../config'
import { SessionModel, SetLogModel, UploadModel, type UserModel } from '../db'
import { AppError } from '../errors'
import type { UploadStorage } from '../storage/upload-storage'
import { sniffVideoType } from '../storage/video-type'
import { isCoachOf } from './access.service'

const STREAM_URL_TTL = '15m'

export interface VideoView {
  id: number
  setLogId: string
  mimeType: string
  sizeBytes: number
  createdAt: string
}

const toView = (u: UploadModel): VideoView => ({
  id: u.id,
  setLogId: u.setLogId,
  mimeType: u.mimeType,
  sizeBytes: u.sizeBytes,
  createdAt: u.createdAt.toISOString(),
})

/** The lifter's own set, or 404. */
async function ownSet(lifter: UserModel, setId: string) {
  const set = await SetLogModel.findByPk(setId, { include: [{ model: SessionModel, as: 'session', attributes: ['athleteId'] }] })
  if (!set || set.session?.athleteId !== lifter.id) throw AppError.notFound('Set')
  return set
}

/**
 * Attaches a form-check video to a logged set. The type is checked from the file's content;
 * the file gets a random name; a set keeps one video, so a new one replaces the old.
 */
export async function attachVideo(storage: UploadStorage, lifter: UserModel, setId: string, file: { path: string; size: number }) {
  try {
    await ownSet(lifter, setId)
    const type = await sniffVideoType(file.path)
    if (!type) throw new AppError(415, 'not_a_video', 'That file is not a video this app can play (MP4, MOV or WebM)')
    const key = `${randomUUID()}.${type.ext}`
    await storage.put(key, file.path)
    const previous = await UploadModel.findAll({ where: { setLogId: setId } })
    const upload = await UploadModel.create({ setLogId: setId, ownerId: lifter.id, storageKey: key, mimeType: type.mime, sizeBytes: file.size })
    for (const old of previous) {
      await storage.remove(old.storageKey)
      await old.destroy()
    }
    return toView(upload)
  } finally {
    await rm(file.path, { force: true })
  }
}

/** Only the lifter who owns it and their coach may watch a video; anyone else gets 403. */
async function visibleUpload(viewer: UserModel, uploadId: number) {
  const upload = await UploadModel.findByPk(uploadId)
  if (!upload) throw AppError.notFound('Video')
  const allowed = upload.ownerId === viewer.id || (viewer.role === 'coach' && (await isCoachOf(viewer.id, upload.ownerId)))
  if (!allowed) throw AppError.forbidden('Only the lifter and their coach can watch this video')
  return upload
}

/**
 * A video element cannot send the bearer token, so the player gets a short-lived signed
 * address for one video instead.
 */
export async function videoStreamUrl(config: AppConfig, viewer: UserModel, uploadId: number) {
  const upload = await visibleUpload(viewer, uploadId)
  const sig = jwt.sign({ upl: upload.id }, config.jwtSecret, { expiresIn: STREAM_URL_TTL, subject: String(viewer.id), audience: 'video' })
  return { url: `/api/uploads/${upload.id}/stream?sig=${encodeURIComponent(sig)}`, video: toView(upload) }
}

/** Streams a video, honouring a single HTTP Range (RFC 9110 §14) so browsers can seek. */
export async function openVideoStream(config: AppConfig, storage: UploadStorage, uploadId: number, sig: string, rangeHeader?: string) {
  let claims: jwt.JwtPayload
  try {
    claims = jwt.verify(sig, config.jwtSecret, { audience: 'video' }) as jwt.JwtPayload
  } catch {
    throw new AppError(403, 'bad_video_link', 'This video link has expired: open the video again')
  }
  if (claims.upl !== uploadId) throw new AppError(403, 'bad_video_link', 'This link is for another video')
  const upload = await UploadModel.findByPk(uploadId)
  if (!upload) throw AppError.notFound('Video')
  const size = await storage.size(upload.storageKey)
  const headers: Record<string, string> = { 'Content-Type': upload.mimeType, 'Accept-Ranges': 'bytes', 'Cache-Control': 'private, max-age=900' }
  const match = rangeHeader ? /^bytes=(\d*)-(\d*)$/.exec(rangeHeader.trim()) : null
  if (rangeHeader && !match) throw new AppError(416, 'bad_range', 'Only one byte range is supported')
  if (match) {
    let start = match[1] === '' ? size - Number(match[2]) : Number(match[1])
    let end = match[1] === '' || match[2] === '' ? size - 1 : Number(match[2])
    start = Math.max(0, start)
    end = Math.min(end, size - 1)
    if (start > end || start >= size) {
      return { status: 416, headers: { ...headers, 'Content-Range': `bytes */${size}` }, stream: null }
    }
    return {
      status: 206,
      headers: { ...headers, 'Content-Range': `bytes ${start}-${end}/${size}`, 'Content-Length': String(end - start + 1) },
      stream: storage.read(upload.storageKey, { start, end }),
    }
  }
  return { status: 200, headers: { ...headers, 'Content-Length': String(size) }, stream: storage.read(upload.storageKey) }
}

export async function removeVideo(storage: UploadStorage, lifter: UserModel, uploadId: number) {
  const upload = await UploadModel.findByPk(uploadId)
  if (!upload || upload.ownerId !== lifter.id) throw AppError.notFound('Video')
  await storage.remove(upload.storageKey)
  await upload.destroy()
}

/** Deletes the files behind these uploads; the rows go with their set or account (cascade). */
export async function removeFilesOf(storage: UploadStorage, where: { setLogId?: string; ownerId?: number }) {
  for (const upload of await UploadModel.findAll({ where })) await storage.remove(upload.storageKey)
}

/** Deletes a set (a set added by hand, or any set of the lifter's) and its video. */
export async function deleteSet(storage: UploadStorage, lifter: UserModel, sessionId: number, setId: string) {
  const set = await ownSet(lifter, setId)
  if (set.sessionId !== sessionId) throw AppError.notFound('Set')
  await removeFilesOf(storage, { setLogId: setId })
  await set.destroy()
}
