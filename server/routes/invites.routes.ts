import { Router } from 'express'
import { idParamsSchema } from '@shared/schemas/common.schema'
import {
  acceptInviteSchema, createInviteSchema, inviteTokenParamsSchema, requestPasswordResetSchema, resetPasswordSchema,
} from '@shared/schemas/invite.schema'
import * as invites from '../controllers/invites.controller'
import { authenticate, authenticateIfToken, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

const coach = [authenticate, requireRole('coach')]
const byToken = { params: inviteTokenParamsSchema }

export const inviteRoutes = Router()
inviteRoutes.post('/invites', ...coach, validate({ body: createInviteSchema }), invites.create)
inviteRoutes.get('/invites', ...coach, invites.list)
// The link in the e-mail: anyone holding it may look and accept (an existing lifter signs in first).
inviteRoutes.get('/invites/:token', validate(byToken), invites.preview)
inviteRoutes.post('/invites/:token/accept', authenticateIfToken, validate({ ...byToken, body: acceptInviteSchema }), invites.accept)
inviteRoutes.delete('/athletes/:id', ...coach, validate({ params: idParamsSchema }), invites.removeAthlete)
inviteRoutes.post('/auth/password-reset', validate({ body: requestPasswordResetSchema }), invites.requestPasswordReset)
inviteRoutes.post('/auth/password-reset/:token', validate({ ...byToken, body: resetPasswordSchema }), invites.resetPassword)
