import { Router } from 'express'
import { listExercisesQuerySchema } from '@shared/schemas/exercise.schema'
import * as exercises from '../controllers/exercises.controller'
import { authenticate } from '../middleware/auth'
import { validate } from '../middleware/validate'

export const exerciseRoutes = Router()
exerciseRoutes.get('/exercises', authenticate, validate({ query: listExercisesQuerySchema }), exercises.list)
