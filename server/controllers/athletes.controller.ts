import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import { listAthletes } from '../services/athlete.service'

export async function list(_req: Request, res: Response) {
  res.json({ athletes: await listAthletes(currentUser(res.locals)) })
}
