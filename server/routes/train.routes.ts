import { Router } from 'express'
import { todayQuerySchema } from '@shared/schemas/train.schema'
import * as train from '../controllers/train.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

export const trainRoutes = Router()
trainRoutes.get('/train/today', authenticate, requireRole('lifter'), validate({ query: todayQuerySchema }), train.today)
