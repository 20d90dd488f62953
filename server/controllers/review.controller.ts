import type { Request, Response } from 'express'
import type { AppConfig } from '../config'
import type { Mailer } from '../mail/mailer'
import { currentUser } from '../middleware/auth'
import * as review from '../services/review.service'

export async function desk(_req: Request, res: Response) {
  res.json({ sessions: await review.listReviewDesk(currentUser(res.locals), res.locals.query) })
}

export async function show(_req: Request, res: Response) {
  res.json({ review: await review.getSessionReview(currentUser(res.locals), res.locals.params.id) })
}

export async function comment(_req: Request, res: Response) {
  res.status(201).json({ comment: await review.addComment(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}

export async function markReviewed(req: Request, res: Response) {
  const config = req.app.locals.config as AppConfig
  const mailer = req.app.locals.mailer as Mailer
  res.json({ review: await review.markReviewed(config, mailer, currentUser(res.locals), res.locals.params.id) })
}
