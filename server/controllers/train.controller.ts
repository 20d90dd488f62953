import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import { getToday } from '../services/train.service'

export async function today(_req: Request, res: Response) {
  res.json(await getToday(currentUser(res.locals), res.locals.query))
}
