import { Router } from 'express'
import { idParamsSchema } from '@shared/schemas/common.schema'
import { gymInputSchema } from '@shared/schemas/gym.schema'
import * as gym from '../controllers/gym.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

const lifter = [authenticate, requireRole('lifter')]
// The athlete's coach only (gym.service checks the link).
const coach = [authenticate, requireRole('coach')]

export const gymRoutes = Router()
gymRoutes.get('/me/gym', ...lifter, gym.showOwn)
gymRoutes.put('/me/gym', ...lifter, validate({ body: gymInputSchema }), gym.saveOwn)
gymRoutes.get('/athletes/:id/gym', ...coach, validate({ params: idParamsSchema }), gym.showAthlete)
gymRoutes.put('/athletes/:id/gym', ...coach, validate({ params: idParamsSchema, body: gymInputSchema }), gym.saveAthlete)
