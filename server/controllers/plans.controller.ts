import type { Request, Response } from 'express'
import { currentUser } from '../middleware/auth'
import * as plans from '../services/plan.service'

export async function list(_req: Request, res: Response) {
  res.json({ plans: await plans.listPlans(currentUser(res.locals), res.locals.query.archived ?? false) })
}

export function templates(_req: Request, res: Response) {
  res.json({ templates: plans.listTemplates() })
}

export async function create(_req: Request, res: Response) {
  res.status(201).json({ plan: await plans.createPlan(currentUser(res.locals), res.locals.body) })
}

export async function createFromTemplate(_req: Request, res: Response) {
  res.status(201).json({ plan: await plans.createFromTemplate(currentUser(res.locals), res.locals.body) })
}

export async function show(_req: Request, res: Response) {
  res.json({ plan: await plans.getPlan(currentUser(res.locals), res.locals.params.id) })
}

export async function replace(_req: Request, res: Response) {
  res.json({ plan: await plans.updatePlan(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}

export async function patch(_req: Request, res: Response) {
  res.json({ plan: await plans.patchPlan(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}

export async function duplicate(_req: Request, res: Response) {
  res.status(201).json({ plan: await plans.duplicatePlan(currentUser(res.locals), res.locals.params.id) })
}

export async function assign(_req: Request, res: Response) {
  res.status(201).json({ assignment: await plans.assignPlan(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}

export async function proposeRotation(_req: Request, res: Response) {
  res.json({ proposal: await plans.proposeRotation(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}

export async function applyRotation(_req: Request, res: Response) {
  res.json({ plan: await plans.applyRotation(currentUser(res.locals), res.locals.params.id, res.locals.body) })
}
