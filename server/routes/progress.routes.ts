import { Router } from 'express'
import { bodyWeightInputSchema, progressQuerySchema } from '@shared/schemas/athlete.schema'
import * as progress from '../controllers/progress.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

export const progressRoutes = Router()
// The lifter's own, or (with athleteId) an athlete the coach or admin may see.
progressRoutes.get('/progress', authenticate, validate({ query: progressQuerySchema }), progress.show)
progressRoutes.post('/body-weights', authenticate, requireRole('lifter'), validate({ body: bodyWeightInputSchema }), progress.bodyWeight)
