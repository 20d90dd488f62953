import { Router } from 'express'
import { adminRoutes } from './admin.routes'
import { athleteRoutes } from './athletes.routes'
import { authRoutes, meRoutes } from './auth.routes'
import { exerciseRoutes } from './exercises.routes'
import { inviteRoutes } from './invites.routes'
import { logbookRoutes } from './logbook.routes'
import { planRoutes } from './plans.routes'
import { progressRoutes } from './progress.routes'
import { uploadRoutes } from './uploads.routes'
import { reviewRoutes } from './review.routes'
import { sessionRoutes } from './sessions.routes'
import { trainRoutes } from './train.routes'

/** Everything under /api. */
export function apiRouter() {
  const api = Router()
  api.get('/health', (_req, res) => {
    res.json({ ok: true })
  })
  api.use(inviteRoutes, authRoutes, meRoutes, trainRoutes, sessionRoutes, reviewRoutes, exerciseRoutes, planRoutes, progressRoutes, uploadRoutes, logbookRoutes, athleteRoutes, adminRoutes)
  return api
}
