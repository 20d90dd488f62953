import { Router } from 'express'
import { idParamsSchema } from '@shared/schemas/common.schema'
import { setStartEstimatesSchema } from '@shared/schemas/start-estimate.schema'
import * as startEstimates from '../controllers/start-estimates.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

const coach = [authenticate, requireRole('coach')]

export const startEstimateRoutes = Router()
// The athlete's coach only (the service checks the link).
startEstimateRoutes.get('/athletes/:id/start-estimates', ...coach, validate({ params: idParamsSchema }), startEstimates.show)
startEstimateRoutes.put('/athletes/:id/start-estimates', ...coach, validate({ params: idParamsSchema, body: setStartEstimatesSchema }), startEstimates.update)
