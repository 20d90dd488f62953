import { Router } from 'express'
import { changePasswordSchema, deleteAccountSchema, registerSchema, signInSchema, updateProfileSchema } from '@shared/schemas/auth.schema'
import * as auth from '../controllers/auth.controller'
import { authenticate } from '../middleware/auth'
import { validate } from '../middleware/validate'

export const authRoutes = Router()
authRoutes.post('/auth/register', validate({ body: registerSchema }), auth.register)
authRoutes.post('/auth/sign-in', validate({ body: signInSchema }), auth.signIn)
authRoutes.post('/auth/sign-out', authenticate, auth.signOut)

export const meRoutes = Router()
meRoutes.get('/me', authenticate, auth.me)
meRoutes.patch('/me', authenticate, validate({ body: updateProfileSchema }), auth.updateMe)
meRoutes.post('/me/cautions', authenticate, auth.acknowledgeCautions)
meRoutes.post('/me/password', authenticate, validate({ body: changePasswordSchema }), auth.changePassword)
meRoutes.delete('/me', authenticate, validate({ body: deleteAccountSchema }), auth.deleteMe)
