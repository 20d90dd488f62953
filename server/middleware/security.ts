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
