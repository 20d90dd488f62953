import { Router } from 'express'
import { createExerciseSchema, listExercisesQuerySchema } from '@shared/schemas/exercise.schema'
import * as exercises from '../controllers/exercises.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

export const exerciseRoutes = Router()
exerciseRoutes.get('/exercises', authenticate, validate({ query: listExercisesQuerySchema }), exercises.list)
exerciseRoutes.post('/exercises', authenticate, requireRole('coach'), validate({ body: createExerciseSchema }), exercises.create)
