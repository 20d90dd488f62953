import { Router } from 'express'
import { idParamsSchema } from '@shared/schemas/common.schema'
import { createCommentSchema, reviewDeskQuerySchema } from '@shared/schemas/review.schema'
import * as review from '../controllers/review.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

// The service checks that the coach coaches the session's athlete (or the lifter owns it).
export const reviewRoutes = Router()
reviewRoutes.get('/review-desk', authenticate, requireRole('coach'), validate({ query: reviewDeskQuerySchema }), review.desk)
reviewRoutes.get('/sessions/:id/review', authenticate, validate({ params: idParamsSchema }), review.show)
reviewRoutes.post(
  '/sessions/:id/comments',
  authenticate,
  requireRole('coach', 'lifter'),
  validate({ params: idParamsSchema, body: createCommentSchema }),
  review.comment,
)
reviewRoutes.post('/sessions/:id/reviewed', authenticate, requireRole('coach'), validate({ params: idParamsSchema }), review.markReviewed)
