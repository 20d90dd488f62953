import type { RequestHandler } from 'express'
import type { Logger } from 'pino'

/** The path as logged: a signed upload link's signature is not. */
export function loggedUrl(url: string): string {
  return url.replace(/sig=[^&]+/, 'sig=[redacted]')
}

/**
 * One log line per request when its answer is sent (or the connection drops): method, path,
 * status and time in ms, never bodies, headers, tokens or cookies. The line has the shape
 * pino-http writes ({ req, res, responseTime }, "request completed"), which this replaced: it
 * made two child loggers per request and serialised the request into them, about a tenth of a
 * set log's CPU time in the benchmark's profile.
 */
export function requestLog(logger: Logger): RequestHandler {
  return (req, res, next) => {
    const started = performance.now()
    let done = false
    const finish = () => {
      if (done) return
      done = true
      res.off('finish', finish)
      res.off('close', finish)
      const line = {
        req: { method: req.method, url: loggedUrl(req.originalUrl) },
        res: { statusCode: res.statusCode },
        responseTime: Math.round(performance.now() - started),
      }
      if (!res.writableFinished) logger.warn(line, 'request aborted')
      else if (res.statusCode >= 500) logger.error(line, 'request errored')
      else logger.info(line, 'request completed')
    }
    res.on('finish', finish)
    res.on('close', finish)
    next()
  }
}
