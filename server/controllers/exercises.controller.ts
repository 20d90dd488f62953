import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import { createExercise, listExercises } from '../services/exercise.service'

export async function list(_req: Request, res: Response) {
  res.json({ exercises: await listExercises(currentUser(res.locals), res.locals.query) })
}

export async function create(_req: Request, res: Response) {
  res.status(201).json({ exercise: await createExercise(currentUser(res.locals), res.locals.body) })
}
