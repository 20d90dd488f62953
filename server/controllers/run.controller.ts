import type { Request, Response } from 'express'
import type { AppConfig } from '../config'
import type { Mailer } from '../mail/mailer'
import { currentUser } from '../middleware/auth'
import { notifyCoachesOfCompletion } from '../services/review.service'
import * as run from '../services/run.service'
import { buildReport } from '../services/session-report.service'
import { sessionForViewer } from '../services/session.service'

export async function current(_req: Request, res: Response) {
  res.json({ session: await run.currentSession(currentUser(res.locals)) })
}

export async function start(_req: Request, res: Response) {
  const { created, session } = await run.startSession(currentUser(res.locals), res.locals.body, res.locals.query)
  res.status(created ? 201 : 200).json({ session })
}

export async function show(_req: Request, res: Response) {
  res.json({ session: await run.getRunSession(currentUser(res.locals), res.locals.params.id) })
}

export async function logSet(_req: Request, res: Response) {
  const { id, setId } = res.locals.params
  res.json(await run.logSet(currentUser(res.locals), id, setId, res.locals.body))
}

export async function swap(_req: Request, res: Response) {
  res.json({ session: await run.swapExercise(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}

export async function addExercise(_req: Request, res: Response) {
  res.json({ session: await run.addExercise(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}

export async function startFromRecentSet(_req: Request, res: Response) {
  res.json({ session: await run.startFromRecentSet(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}

export async function complete(req: Request, res: Response) {
  const lifter = currentUser(res.locals)
  const { justCompleted, session, report } = await run.completeSession(lifter, res.locals.params.id, res.locals.body)
  res.json({ report })
  if (justCompleted) {
    // After answering: a slow or failing mail server never holds up or fails the lifter's finish.
    notifyCoachesOfCompletion(req.app.locals.config as AppConfig, req.app.locals.mailer as Mailer, session, lifter).catch((err) =>
      console.error('[mail] completion notice failed', err),
    )
  }
}

export async function report(_req: Request, res: Response) {
  const { session, athlete } = await sessionForViewer(currentUser(res.locals), res.locals.params.id)
  res.json({ report: await buildReport(session, athlete) })
}

export async function takeNextSteps(_req: Request, res: Response) {
  res.json({ report: await run.takeNextSteps(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}
