import { Router } from 'express'
import { idParamsSchema } from '@shared/schemas/common.schema'
import {
  applyRotationSchema, assignPlanSchema, listPlansQuerySchema, planFromTemplateSchema, planInputSchema, rotateVersionSchema,
  updatePlanSchema,
} from '@shared/schemas/plan.schema'
import * as plans from '../controllers/plans.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

// Coaches build plans for their athletes; self-coached lifters build their own. The service
// lets only a plan's author change it, and lets athletes on a plan (and their coach) read it.
const author = [authenticate, requireRole('coach', 'lifter')]
const byId = { params: idParamsSchema }

export const planRoutes = Router()
planRoutes.get('/plans', ...author, validate({ query: listPlansQuerySchema }), plans.list)
planRoutes.post('/plans', ...author, validate({ body: planInputSchema }), plans.create)
planRoutes.get('/plans/templates', ...author, plans.templates)
planRoutes.post('/plans/from-template', ...author, validate({ body: planFromTemplateSchema }), plans.createFromTemplate)
planRoutes.get('/plans/:id', authenticate, validate(byId), plans.show)
planRoutes.put('/plans/:id', ...author, validate({ ...byId, body: planInputSchema }), plans.replace)
planRoutes.patch('/plans/:id', ...author, validate({ ...byId, body: updatePlanSchema }), plans.patch)
planRoutes.post('/plans/:id/duplicate', ...author, validate(byId), plans.duplicate)
planRoutes.post('/plans/:id/assignments', ...author, validate({ ...byId, body: assignPlanSchema }), plans.assign)
planRoutes.post('/plans/:id/rotation-proposal', ...author, validate({ ...byId, body: rotateVersionSchema }), plans.proposeRotation)
planRoutes.post('/plans/:id/rotation', ...author, validate({ ...byId, body: applyRotationSchema }), plans.applyRotation)
