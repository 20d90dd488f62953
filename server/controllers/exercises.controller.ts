import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import { listExercises } from '../services/exercise.service'

export async function list(_req: Request, res: Response) {
  res.json({ exercises: await listExercises(currentUser(res.locals), res.locals.query) })
}
