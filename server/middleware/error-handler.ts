import type { ErrorRequestHandler, RequestHandler } from 'express'
import type { Logger } from 'pino'
import { z } from '@shared/schemas/zod'
import { AppError } from '../errors'
import { loggedUrl } from './request-log'
import { toFieldIssues } from './validate'

export const notFound: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not_found', `No route for ${req.method} ${req.path}`))
}

/** The one place errors become JSON. Never sends a stack trace or SQL text to a client. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let error: AppError
  if (err instanceof AppError) error = err
  else if (err instanceof z.core.$ZodError) error = AppError.badRequest('Some fields are not valid', toFieldIssues(err))
  else if (err?.type === 'entity.parse.failed') error = new AppError(400, 'invalid_json', 'The body is not valid JSON')
  else if (err?.type === 'entity.too.large') error = new AppError(413, 'payload_too_large', 'The body is too large')
  else if (err?.name === 'MulterError') {
    error = err.code === 'LIMIT_FILE_SIZE'
      ? new AppError(413, 'file_too_large', 'The file is larger than this server accepts')
      : AppError.badRequest('The upload is not valid', [{ path: String(err.field ?? 'file'), message: String(err.message) }])
  }
  else if (typeof err?.status === 'number' && err.status >= 400 && err.status < 500 && err.expose) {
    error = new AppError(err.status, 'bad_request', String(err.message))
  } else {
    // Logged in full on the server (structured, with no request body); the client gets no details.
    (req.app.locals.logger as Logger | undefined)?.error({ err, req: { method: req.method, url: loggedUrl(req.originalUrl) } }, 'request failed')
    error = new AppError(500, 'internal', 'Something went wrong on our side')
  }
  res.status(error.status).json({
    error: { code: error.code, message: error.message, ...(error.issues ? { issues: error.issues } : {}) },
  })
}
