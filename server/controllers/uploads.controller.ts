import type { Request, Response } from 'express'
import type { AppConfig } from '../config'
import { AppError } from '../errors'
import { currentUser } from '../middleware/auth'
import type { UploadStorage } from '../storage/upload-storage'
import * as uploads from '../services/upload.service'

const configOf = (req: Request) => req.app.locals.config as AppConfig
const storageOf = (req: Request) => req.app.locals.storage as UploadStorage

export async function attach(req: Request, res: Response) {
  if (!req.file) throw AppError.badRequest('Attach a video', [{ path: 'video', message: 'Send the file in the field "video"' }])
  res.status(201).json({ video: await uploads.attachVideo(storageOf(req), currentUser(res.locals), res.locals.params.setId, req.file) })
}

export async function url(req: Request, res: Response) {
  res.json(await uploads.videoStreamUrl(configOf(req), currentUser(res.locals), res.locals.params.id))
}

export async function stream(req: Request, res: Response) {
  const { status, headers, stream } = await uploads.openVideoStream(
    configOf(req), storageOf(req), res.locals.params.id, res.locals.query.sig, req.get('range'),
  )
  res.status(status).set(headers)
  if (!stream) return res.end()
  stream.on('error', () => res.destroy())
  stream.pipe(res)
}

export async function remove(req: Request, res: Response) {
  await uploads.removeVideo(storageOf(req), currentUser(res.locals), res.locals.params.id)
  res.status(204).end()
}

export async function deleteSet(req: Request, res: Response) {
  const { id, setId } = res.locals.params
  await uploads.deleteSet(storageOf(req), currentUser(res.locals), id, setId)
  res.status(204).end()
}
