import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { RequestHandler } from 'express'
import multer from 'multer'
import type { AppConfig } from '../config'

const uploaders = new Map<string, RequestHandler>()

/** One video in the multipart field "video", written to a temporary file, size-limited by config. */
export const videoUpload: RequestHandler = (req, res, next) => {
  const config = req.app.locals.config as AppConfig
  const key = `${config.uploads.dir}|${config.uploads.maxBytes}`
  let handler = uploaders.get(key)
  if (!handler) {
    const tmp = join(config.uploads.dir, 'tmp')
    mkdirSync(tmp, { recursive: true })
    handler = multer({ dest: tmp, limits: { fileSize: config.uploads.maxBytes, files: 1, fields: 5 } }).single('video')
    uploaders.set(key, handler)
  }
  handler(req, res, next)
}
