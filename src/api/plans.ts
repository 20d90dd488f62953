import { z } from '@shared/schemas/zod'
import {
  planSchema,
  planSummarySchema,
  rotationProposalSchema,
  type ApplyRotationInput,
  type AssignPlanInput,
  type Plan,
  type PlanFromTemplateInput,
  type PlanInput,
  type PlanSummary,
  type RotateVersionInput,
  type RotationProposal,
  type UpdatePlanInput,
} from '@shared/schemas/plan.schema'
import { request } from './client'

/** A split template as the API lists it (the day names only). */
export const planTemplateSchema = z.object({
  id: z.string(),
  name: z.string(),
  splitKind: z.string(),
  description: z.string(),
  days: z.array(z.string()),
})
export type PlanTemplateSummary = z.infer<typeof planTemplateSchema>

const planListSchema = z.object({ plans: z.array(planSummarySchema) })
const templateListSchema = z.object({ templates: z.array(planTemplateSchema) })
const planBodySchema = z.object({ plan: planSchema })
const proposalBodySchema = z.object({ proposal: rotationProposalSchema })

/** The caller's own plans, archived ones or the others. */
export async function listPlans(params: { archived?: boolean } = {}): Promise<PlanSummary[]> {
  const query = { archived: params.archived === undefined ? undefined : String(params.archived) }
  return (await request('GET', '/plans', { query, schema: planListSchema })).plans
}

export async function listPlanTemplates(): Promise<PlanTemplateSummary[]> {
  return (await request('GET', '/plans/templates', { schema: templateListSchema })).templates
}

export async function createPlanFromTemplate(input: PlanFromTemplateInput): Promise<Plan> {
  return (await request('POST', '/plans/from-template', { body: input, schema: planBodySchema })).plan
}

export async function createPlan(input: PlanInput): Promise<Plan> {
  return (await request('POST', '/plans', { body: input, schema: planBodySchema })).plan
}

export async function getPlan(id: number): Promise<Plan> {
  return (await request('GET', `/plans/${id}`, { schema: planBodySchema })).plan
}

/** Replaces the days and slots; existing days and slots are named by id so their history stays. */
export async function replacePlan(id: number, input: PlanInput): Promise<Plan> {
  return (await request('PUT', `/plans/${id}`, { body: input, schema: planBodySchema })).plan
}

/** Rename or archive / restore. */
export async function updatePlan(id: number, input: UpdatePlanInput): Promise<Plan> {
  return (await request('PATCH', `/plans/${id}`, { body: input, schema: planBodySchema })).plan
}

export async function duplicatePlan(id: number): Promise<Plan> {
  return (await request('POST', `/plans/${id}/duplicate`, { schema: planBodySchema })).plan
}

export async function assignPlan(id: number, input: AssignPlanInput): Promise<void> {
  await request('POST', `/plans/${id}/assignments`, { body: input })
}

export async function proposeRotation(id: number, input: RotateVersionInput): Promise<RotationProposal> {
  return (await request('POST', `/plans/${id}/rotation-proposal`, { body: input, schema: proposalBodySchema })).proposal
}

export async function applyRotation(id: number, input: ApplyRotationInput): Promise<Plan> {
  return (await request('POST', `/plans/${id}/rotation`, { body: input, schema: planBodySchema })).plan
}
