import { Router } from 'express'
import { idParamsSchema } from '@shared/schemas/common.schema'
import {
  addExerciseSchema, completeSessionSchema, logSetSchema, setParamsSchema, startFromRecentSetSchema, startSessionSchema,
  swapExerciseSchema, takeNextStepsSchema,
} from '@shared/schemas/run.schema'
import { listSessionsQuerySchema } from '@shared/schemas/session.schema'
import { todayQuerySchema } from '@shared/schemas/train.schema'
import * as run from '../controllers/run.controller'
import * as sessions from '../controllers/sessions.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

const lifter = [authenticate, requireRole('lifter')]
const byId = validate({ params: idParamsSchema })

export const sessionRoutes = Router()
// Reading: the lifter, their coach or an admin (the service checks who may see which athlete).
sessionRoutes.get('/sessions', authenticate, validate({ query: listSessionsQuerySchema }), sessions.list)
// Running a session: only the lifter, on their own sessions.
sessionRoutes.get('/sessions/current', ...lifter, run.current)
sessionRoutes.post('/sessions', ...lifter, validate({ body: startSessionSchema, query: todayQuerySchema }), run.start)
sessionRoutes.get('/sessions/:id', authenticate, byId, sessions.show)
sessionRoutes.get('/sessions/:id/run', ...lifter, byId, run.show)
sessionRoutes.get('/sessions/:id/report', authenticate, byId, run.report)
sessionRoutes.put('/sessions/:id/sets/:setId', ...lifter, validate({ params: setParamsSchema, body: logSetSchema }), run.logSet)
sessionRoutes.post('/sessions/:id/swap', ...lifter, validate({ params: idParamsSchema, body: swapExerciseSchema }), run.swap)
sessionRoutes.post('/sessions/:id/exercises', ...lifter, validate({ params: idParamsSchema, body: addExerciseSchema }), run.addExercise)
sessionRoutes.post('/sessions/:id/start-estimate', ...lifter, validate({ params: idParamsSchema, body: startFromRecentSetSchema }), run.startFromRecentSet)
sessionRoutes.post('/sessions/:id/complete', ...lifter, validate({ params: idParamsSchema, body: completeSessionSchema }), run.complete)
// The lifter takes next steps; their coach may edit them.
sessionRoutes.post('/sessions/:id/next-steps', authenticate, requireRole('lifter', 'coach'), validate({ params: idParamsSchema, body: takeNextStepsSchema }), run.takeNextSteps)
