import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import { getAthleteGym, getOwnGym, saveAthleteGym, saveOwnGym } from '../services/gym.service'

export async function showOwn(_req: Request, res: Response) {
  res.json(await getOwnGym(currentUser(res.locals)))
}

export async function saveOwn(_req: Request, res: Response) {
  res.json(await saveOwnGym(currentUser(res.locals), res.locals.body))
}

export async function showAthlete(_req: Request, res: Response) {
  res.json(await getAthleteGym(currentUser(res.locals), res.locals.params.id))
}

export async function saveAthlete(_req: Request, res: Response) {
  res.json(await saveAthleteGym(currentUser(res.locals), res.locals.params.id, res.locals.body))
}
