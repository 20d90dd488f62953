import express, { Router } from 'express'
import { exportQuerySchema, importRequestSchema } from '@shared/schemas/logbook.schema'
import * as logbook from '../controllers/logbook.controller'
import { authenticate, requireRole } from '../middleware/auth'
import { validate } from '../middleware/validate'

// An import carries the CSV text (up to 5 MB), more than the API's usual body limit.
const largeJson = express.json({ limit: '6mb' })

export const logbookRoutes = Router()
logbookRoutes.get('/logbook/export', authenticate, validate({ query: exportQuerySchema }), logbook.exportLogbook)
logbookRoutes.post('/logbook/import/preview', largeJson, authenticate, requireRole('lifter'), validate({ body: importRequestSchema }), logbook.preview)
logbookRoutes.post('/logbook/import', largeJson, authenticate, requireRole('lifter'), validate({ body: importRequestSchema }), logbook.commit)
