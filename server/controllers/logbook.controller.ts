import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import * as logbook from '../services/logbook.service'

export async function exportLogbook(_req: Request, res: Response) {
  const file = await logbook.exportLogbook(currentUser(res.locals), res.locals.query)
  res.type(file.type).attachment(file.filename).send(file.body)
}

export async function preview(_req: Request, res: Response) {
  const { checked: _checked, ...preview } = await logbook.previewImport(currentUser(res.locals), res.locals.body)
  res.json({ preview })
}

export async function commit(_req: Request, res: Response) {
  res.status(201).json({ result: await logbook.commitImport(currentUser(res.locals), res.locals.body) })
}
