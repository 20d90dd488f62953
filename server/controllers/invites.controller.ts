import type { Request, Response } from 'express'
import type { AppConfig } from '../config'
import type { Mailer } from '../mail/mailer'
import { currentUser } from '../middleware/auth'
import * as auth from '../services/auth.service'
import * as invites from '../services/invite.service'

const configOf = (req: Request) => req.app.locals.config as AppConfig
const mailerOf = (req: Request) => req.app.locals.mailer as Mailer

export async function create(req: Request, res: Response) {
  res.status(201).json({ invite: await invites.createInvite(configOf(req), mailerOf(req), currentUser(res.locals), res.locals.body) })
}

export async function list(_req: Request, res: Response) {
  res.json({ invites: await invites.listInvites(currentUser(res.locals)) })
}

export async function preview(_req: Request, res: Response) {
  res.json({ invite: await invites.previewInvite(res.locals.params.token) })
}

export async function accept(req: Request, res: Response) {
  const signedIn = res.locals.user ? currentUser(res.locals) : null
  res.json(await invites.acceptInvite(configOf(req), res.locals.params.token, res.locals.body, signedIn))
}

export async function removeAthlete(_req: Request, res: Response) {
  await invites.removeAthlete(currentUser(res.locals), res.locals.params.id)
  res.status(204).end()
}

export async function requestPasswordReset(req: Request, res: Response) {
  await auth.requestPasswordReset(configOf(req), mailerOf(req), res.locals.body.email)
  res.status(202).json({ ok: true })
}

export async function resetPassword(req: Request, res: Response) {
  res.json(await auth.resetPassword(configOf(req), res.locals.params.token, res.locals.body.password))
}
