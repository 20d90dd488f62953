import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import { setStartEstimates, startEstimatesFor } from '../services/start-estimate.service'

export async function show(_req: Request, res: Response) {
  res.json(await startEstimatesFor(currentUser(res.locals), res.locals.params.id))
}

export async function update(_req: Request, res: Response) {
  res.json(await setStartEstimates(currentUser(res.locals), res.locals.params.id, res.locals.body))
}
