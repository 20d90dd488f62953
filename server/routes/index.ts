import { Router } from 'express'
import type { AppConfig } from '../config'
import { authRateLimit } from '../middleware/security'
import { adminRoutes } from './admin.routes'
import { athleteRoutes } from './athletes.routes'
import { authRoutes, meRoutes } from './auth.routes'
import { exerciseRoutes } from './exercises.routes'
import { gymRoutes } from './gym.routes'
import { inviteRoutes } from './invites.routes'
import { logbookRoutes } from './logbook.routes'
import { planRoutes } from './plans.routes'
import { progressRoutes } from './progress.routes'
import { uploadRoutes } from './uploads.routes'
import { reviewRoutes } from './review.routes'
import { sessionRoutes } from './sessions.routes'
import { startEstimateRoutes } from './start-estimates.routes'
import { trainRoutes } from './train.routes'

/** Everything under /api. */
export function apiRouter(config: AppConfig) {
  const api = Router()
  // Guessing and sending endpoints get a per-address attempt limit.
  const limited = authRateLimit(config)
  for (const path of ['/auth/sign-in', '/auth/register', '/auth/password-reset', '/invites', '/me/password']) api.post(path, limited)
  api.get('/health', (_req, res) => {
    res.json({ ok: true })
  })
  api.use(inviteRoutes, authRoutes, meRoutes, trainRoutes, sessionRoutes, reviewRoutes, exerciseRoutes, planRoutes, progressRoutes, uploadRoutes, logbookRoutes, gymRoutes, startEstimateRoutes, athleteRoutes, adminRoutes)
  return api
}
