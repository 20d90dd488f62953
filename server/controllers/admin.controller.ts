import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import * as admin from '../services/admin.service'

export async function listUsers(_req: Request, res: Response) {
  res.json({ users: await admin.listUsers() })
}

export async function updateUser(_req: Request, res: Response) {
  res.json({ user: await admin.updateUser(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}
