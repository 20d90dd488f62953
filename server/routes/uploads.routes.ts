import { Router } from 'express'
import { z } from '@shared/schemas/zod'
import { idParamsSchema } from '@shared/schemas/common.schema'
import { setParamsSchema } from '@shared/schemas/run.schema'
import * as uploads from '../controllers/uploads.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'
import { videoUpload } from '../middleware/video-upload'

const setIdParams = z.object({ setId: z.uuid() })
const streamQuery = z.object({ sig: z.string().check(z.minLength(10), z.maxLength(2000)) })

export const uploadRoutes = Router()
uploadRoutes.post('/sets/:setId/video', authenticate, requireRole('lifter'), validate({ params: setIdParams }), videoUpload, uploads.attach)
uploadRoutes.get('/uploads/:id/url', authenticate, validate({ params: idParamsSchema }), uploads.url)
// The video element cannot send the bearer token: the signed address is the permission.
uploadRoutes.get('/uploads/:id/stream', validate({ params: idParamsSchema, query: streamQuery }), uploads.stream)
uploadRoutes.delete('/uploads/:id', authenticate, requireRole('lifter'), validate({ params: idParamsSchema }), uploads.remove)
uploadRoutes.delete('/sessions/:id/sets/:setId', authenticate, requireRole('lifter'), validate({ params: setParamsSchema }), uploads.deleteSet)
