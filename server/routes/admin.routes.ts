import { Router } from 'express'
import { adminUpdateUserSchema } from '@shared/schemas/admin.schema'
import { idParamsSchema } from '@shared/schemas/common.schema'
import * as admin from '../controllers/admin.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

export const adminRoutes = Router()
adminRoutes.get('/admin/users', authenticate, requireRole('admin'), admin.listUsers)
adminRoutes.patch(
  '/admin/users/:id',
  authenticate,
  requireRole('admin'),
  validate({ params: idParamsSchema, body: adminUpdateUserSchema }),
  admin.updateUser,
)
