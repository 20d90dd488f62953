import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import { getProgress, logBodyWeight } from '../services/progress.service'

export async function show(_req: Request, res: Response) {
  res.json({ progress: await getProgress(currentUser(res.locals), res.locals.query) })
}

export async function bodyWeight(_req: Request, res: Response) {
  res.status(201).json({ entry: await logBodyWeight(currentUser(res.locals), res.locals.body) })
}
