import type { Request, Response } from 'express'
import type { AppConfig } from '../config'
import type { UploadStorage } from '../storage/upload-storage'
import { currentUser } from '../middleware/auth'
import * as auth from '../services/auth.service'
import { toUser } from '../services/presenters'

const configOf = (req: Request) => req.app.locals.config as AppConfig

export async function register(req: Request, res: Response) {
  res.status(201).json(await auth.register(configOf(req), res.locals.body))
}

export async function signIn(req: Request, res: Response) {
  res.json(await auth.signIn(configOf(req), res.locals.body))
}

/** Tokens are kept by the client only; signing out there is enough for one device. */
export function signOut(_req: Request, res: Response) {
  res.status(204).end()
}

export function me(_req: Request, res: Response) {
  res.json({ user: toUser(currentUser(res.locals)) })
}

export async function updateMe(_req: Request, res: Response) {
  res.json({ user: await auth.updateProfile(currentUser(res.locals), res.locals.body) })
}

export async function acknowledgeCautions(_req: Request, res: Response) {
  res.json({ user: await auth.acknowledgeCautions(currentUser(res.locals)) })
}

export async function changePassword(req: Request, res: Response) {
  res.json(await auth.changePassword(configOf(req), currentUser(res.locals), res.locals.body))
}

export async function deleteMe(req: Request, res: Response) {
  await auth.deleteAccount(req.app.locals.storage as UploadStorage, currentUser(res.locals), res.locals.body.password)
  res.status(204).end()
}
