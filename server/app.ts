import { existsSync } from 'node:fs'
import { join } from 'node:path'
import compression from 'compression'
import express from 'express'
import type { AppConfig } from './config'
import type { Mailer } from './mail/mailer'
import { errorHandler, notFound } from './middleware/error-handler'
import { apiRouter } from './routes'
import { devRoutes } from './routes/dev.routes'
import { createLogger } from './logger'
import { securityHeaders } from './middleware/security'
import { requestLog } from './middleware/request-log'
import type { Logger } from 'pino'
import { LocalDiskStorage, type UploadStorage } from './storage/upload-storage'

export interface AppDeps {
  mailer: Mailer
  logger?: Logger
  /** Form-check videos; local disk under config.uploads.dir unless another store is given. */
  storage?: UploadStorage
}

/** Builds the Express app; never listens (server/index.ts does). */
export function createApp(config: AppConfig, deps: AppDeps) {
  const app = express()
  app.locals.config = config
  app.locals.mailer = deps.mailer
  app.locals.storage = deps.storage ?? new LocalDiskStorage(config.uploads.dir)
  app.disable('x-powered-by')
  app.set('trust proxy', 'loopback')
  const logger = deps.logger ?? createLogger(config)
  app.locals.logger = logger
  // One log line per request: method, path, status, time; never bodies, tokens or cookies.
  app.use(requestLog(logger))
  app.use(securityHeaders())
  // gzip or brotli for the client's files and the bigger JSON answers (a phone on a weak gym signal
  // pays for every byte); answers under 1 KB go as they are.
  app.use(compression())
  // Small JSON bodies everywhere; a logbook import (CSV text up to 5 MB) has its own parser.
  const smallJson = express.json({ limit: '100kb' })
  app.use((req, res, next) => (req.path.startsWith('/api/logbook/import') ? next() : smallJson(req, res, next)))

  // The local outbox exists only while no real SMTP server is configured.
  if (config.mail.smtp === null) app.use(devRoutes(config))
  app.use('/api', apiRouter(config), notFound)

  // Production: the same process serves the built client; unknown paths get the app shell.
  if (config.clientDist && existsSync(config.clientDist)) {
    const indexHtml = join(config.clientDist, 'index.html')
    app.use(
      express.static(config.clientDist, {
        index: false,
        maxAge: '1h',
        // The service worker, its registration and the manifest must be checked on every visit,
        // or an update would wait an hour; hashed assets can be cached.
        setHeaders: (res, path) => {
          if (/(sw\.js|registerSW\.js|workbox-[^/]*\.js|\.webmanifest|\.html)$/.test(path)) res.setHeader('Cache-Control', 'no-cache')
        },
      }),
    )
    app.get(/^\/(?!api\/).*/, (_req, res) => {
      res.set('Cache-Control', 'no-cache').sendFile(indexHtml)
    })
  }

  app.use(notFound)
  app.use(errorHandler)
  return app
}
