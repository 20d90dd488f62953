import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import * as sessions from '../services/session.service'

export async function list(_req: Request, res: Response) {
  res.json({ sessions: await sessions.listSessions(currentUser(res.locals), res.locals.query) })
}

export async function show(_req: Request, res: Response) {
  res.json({ session: await sessions.getSession(currentUser(res.locals), res.locals.params.id) })
}
