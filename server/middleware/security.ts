import type { RequestHandler } from 'express'
import { rateLimit } from 'express-rate-limit'
import helmet from 'helmet'
import type { AppConfig } from '../config'

/**
 * Security headers with a content security policy that allows only our own origin. The app
 * ships its fonts, sounds and scripts itself; Vant's icon font is inlined as a data: URI and
 * recorded videos play from blob: addresses before upload.
 */
export function securityHeaders(): RequestHandler {
  const headers = fixedHeaders(helmetForApp())
  const names = Object.keys(headers)
  // The same headers for every answer: helmet builds them once here instead of per request
  // (its CSP string alone was rebuilt from the directives on every call).
  return (_req, res, next) => {
    for (const name of names) res.setHeader(name, headers[name])
    res.removeHeader('X-Powered-By')
    next()
  }
}

/**
 * The headers a helmet middleware sets, read by running it once against a recording response.
 * Only for helmet options with fixed values (no per-request functions such as CSP nonces).
 */
export function fixedHeaders(middleware: RequestHandler): Record<string, string> {
  const headers: Record<string, string> = {}
  const res = {
    setHeader(name: string, value: string | number | string[]) {
      headers[name] = Array.isArray(value) ? value.join(', ') : String(value)
      return res
    },
    removeHeader(name: string) {
      delete headers[name]
    },
  }
  let called = false
  void middleware({} as never, res as never, ((error?: unknown) => {
    if (error) throw error
    called = true
  }) as never)
  if (!called) throw new Error('the security headers middleware did not finish synchronously')
  return headers
}

/** helmet with the app's options, as a per-request middleware (the tests compare against it). */
export function helmetForApp(): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'"],
        'style-src': ["'self'", "'unsafe-inline'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'", 'data:'],
        'media-src': ["'self'", 'blob:'],
        'connect-src': ["'self'"],
        'worker-src': ["'self'"],
        'manifest-src': ["'self'"],
        'object-src': ["'none'"],
        'frame-ancestors': ["'none'"],
        'base-uri': ["'self'"],
        'form-action': ["'self'"],
      },
    },
    // Served over plain HTTP on a local network in development: no forced HTTPS upgrade there.
    strictTransportSecurity: false,
  })
}

/**
 * Attempts per client address on the endpoints that guess or send: sign-in, registration,
 * password reset and invitations. Counted in this process's memory: several API processes
 * behind a proxy would need a shared store (express-rate-limit supports Redis and others).
 */
export function authRateLimit(config: AppConfig): RequestHandler {
  return rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: config.rateLimitAuth,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'too_many_attempts', message: 'Too many attempts: wait a few minutes and try again' } })
    },
  })
}
