import { Router } from 'express'
import * as athletes from '../controllers/athletes.controller'
import { authenticate, requireRole } from '../middleware/auth'

export const athleteRoutes = Router()
athleteRoutes.get('/athletes', authenticate, requireRole('coach'), athletes.list)
