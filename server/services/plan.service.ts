import { Op, fn, col, type Transaction } from 'sequelize'
import { PLAN_TEMPLATES } from '@shared/domain/plan-templates'
import { freshExercisesFor, type RotationSlot } from '@shared/domain/rotation'
import { DEFAULT_REST_SECONDS, DEFAULT_SCHEMES, setSchemeSchema, type SetScheme } from '@shared/domain/schemes'
import type {
  ApplyRotationInput, AssignPlanInput, DayInput, Plan, PlanFromTemplateInput, PlanInput, PlanSummary,
  RotateVersionInput, RotationProposal, Slot, UpdatePlanInput,
} from '@shared/schemas/plan.schema'
import {
  AssignmentModel, DayVersionModel, ExerciseModel, PlanDayModel, PlanModel, SlotModel, UserModel,
} from '../db'
import { AppError } from '../errors'
import { isCoachOf } from './access.service'

const planInclude = [
  {
    model: PlanDayModel,
    as: 'days',
    include: [
      {
        model: DayVersionModel,
        as: 'versions',
        include: [{ model: SlotModel, as: 'slots', include: [{ model: ExerciseModel, as: 'exercise' }] }],
      },
    ],
  },
]

function toSlot(slot: SlotModel): Slot {
  const parsed = setSchemeSchema.safeParse(slot.scheme)
  return {
    id: slot.id,
    exerciseId: slot.exerciseId,
    exerciseName: slot.exercise?.name ?? '',
    pattern: slot.exercise?.pattern ?? '',
    primaryMuscles: (slot.exercise?.primaryMuscles as string[]) ?? [],
    secondaryMuscles: (slot.exercise?.secondaryMuscles as string[]) ?? [],
    role: slot.role,
    scheme: parsed.success ? parsed.data : DEFAULT_SCHEMES[slot.role],
    restSec: slot.restSec,
  }
}

function toPlan(plan: PlanModel): Plan {
  const days = [...(plan.days ?? [])].sort((a, b) => a.position - b.position)
  return {
    id: plan.id,
    ownerId: plan.ownerId,
    name: plan.name,
    splitKind: plan.splitKind,
    archived: plan.archivedAt !== null,
    updatedAt: plan.updatedAt.toISOString(),
    days: days.map((day) => {
      const version = (label: 'I' | 'II') =>
        [...(day.versions?.find((v) => v.label === label)?.slots ?? [])].sort((a, b) => a.position - b.position).map(toSlot)
      return { id: day.id, position: day.position, name: day.name, isRest: day.isRest, versions: { I: version('I'), II: version('II') } }
    }),
  }
}

async function loadPlan(id: number, transaction?: Transaction) {
  return PlanModel.findByPk(id, { include: planInclude, transaction })
}

/** May this user read the plan? Its owner, an athlete it is assigned to, that athlete's coach, or an admin. */
async function canRead(viewer: UserModel, plan: PlanModel) {
  if (viewer.role === 'admin' || plan.ownerId === viewer.id) return true
  const assigned = await AssignmentModel.findAll({ where: { planId: plan.id, active: true }, attributes: ['athleteId'] })
  if (assigned.some((a) => a.athleteId === viewer.id)) return true
  if (viewer.role === 'coach') {
    for (const a of assigned) if (await isCoachOf(viewer.id, a.athleteId)) return true
  }
  return false
}

/** Only the owner edits, duplicates, assigns or archives a plan; others get 404 or 403. */
async function ownedPlan(viewer: UserModel, id: number, transaction?: Transaction) {
  const plan = await loadPlan(id, transaction)
  if (!plan || !(await canRead(viewer, plan))) throw AppError.notFound('Plan')
  if (plan.ownerId !== viewer.id) throw AppError.forbidden('Only the plan\'s author can change it')
  return plan
}

export async function getPlan(viewer: UserModel, id: number): Promise<Plan> {
  const plan = await loadPlan(id)
  if (!plan || !(await canRead(viewer, plan))) throw AppError.notFound('Plan')
  return toPlan(plan)
}

export async function listPlans(viewer: UserModel, archived = false): Promise<PlanSummary[]> {
  const plans = await PlanModel.findAll({
    where: { ownerId: viewer.id, archivedAt: archived ? { [Op.ne]: null } : null },
    order: [['updatedAt', 'DESC']],
  })
  const ids = plans.map((p) => p.id)
  const [dayCounts, assignedCounts] = await Promise.all([
    PlanDayModel.findAll({ attributes: ['planId', [fn('COUNT', col('id')), 'count']], where: { planId: ids }, group: ['planId'], raw: true }) as unknown as Promise<Array<{ planId: number; count: number }>>,
    AssignmentModel.findAll({ attributes: ['planId', [fn('COUNT', col('id')), 'count']], where: { planId: ids, active: true }, group: ['planId'], raw: true }) as unknown as Promise<Array<{ planId: number; count: number }>>,
  ])
  return plans.map((p) => ({
    id: p.id,
    name: p.name,
    splitKind: p.splitKind,
    archived: p.archivedAt !== null,
    dayCount: Number(dayCounts.find((d) => d.planId === p.id)?.count ?? 0),
    assignedCount: Number(assignedCounts.find((d) => d.planId === p.id)?.count ?? 0),
    updatedAt: p.updatedAt.toISOString(),
  }))
}

/** Exercises a user may put in a plan: the shared library and their own. */
async function assertUsableExercises(viewer: UserModel, days: DayInput[], transaction?: Transaction) {
  const ids = [...new Set(days.flatMap((d) => [...d.versions.I, ...d.versions.II].map((s) => s.exerciseId)))]
  if (ids.length === 0) return
  const found = await ExerciseModel.findAll({ where: { id: ids, [Op.or]: [{ ownerId: null }, { ownerId: viewer.id }] }, transaction })
  const missing = ids.filter((id) => !found.some((e) => e.id === id))
  if (missing.length > 0) {
    throw AppError.badRequest('Some exercises are not in your library', [{ path: 'days', message: `Unknown exercise ids: ${missing.join(', ')}` }])
  }
}

/**
 * Writes the days, versions and slots of a plan. Rows named by id are updated in place (so the
 * history attached to a slot stays with it); rows not sent any more are removed; sessions keep
 * their own copy of what was planned, so editing a plan never rewrites logged sessions.
 */
async function writeDays(plan: PlanModel, days: DayInput[], transaction: Transaction) {
  const existingDays = await PlanDayModel.findAll({ where: { planId: plan.id }, transaction })
  const keptDayIds = new Set<number>()
  for (const [position, day] of days.entries()) {
    let dayRow = day.id ? existingDays.find((d) => d.id === day.id) : undefined
    if (day.id && !dayRow) throw AppError.badRequest('Unknown day', [{ path: `days.${position}.id`, message: 'Not a day of this plan' }])
    if (dayRow) await dayRow.update({ position, name: day.name, isRest: day.isRest }, { transaction })
    else dayRow = await PlanDayModel.create({ planId: plan.id, position, name: day.name, isRest: day.isRest }, { transaction })
    keptDayIds.add(dayRow.id)
    for (const label of ['I', 'II'] as const) {
      const [version] = await DayVersionModel.findOrCreate({ where: { planDayId: dayRow.id, label }, defaults: { planDayId: dayRow.id, label }, transaction })
      const existingSlots = await SlotModel.findAll({ where: { dayVersionId: version.id }, transaction })
      const keptSlotIds = new Set<number>()
      for (const [slotPosition, slot] of day.versions[label].entries()) {
        const values = { exerciseId: slot.exerciseId, position: slotPosition, role: slot.role, scheme: slot.scheme, restSec: slot.restSec }
        const existing = slot.id ? existingSlots.find((s) => s.id === slot.id) : undefined
        if (slot.id && !existing) {
          throw AppError.badRequest('Unknown slot', [{ path: `days.${position}.versions.${label}.${slotPosition}.id`, message: 'Not a slot of this day' }])
        }
        if (existing) {
          await existing.update(values, { transaction })
          keptSlotIds.add(existing.id)
        } else {
          keptSlotIds.add((await SlotModel.create({ dayVersionId: version.id, ...values }, { transaction })).id)
        }
      }
      await SlotModel.destroy({ where: { dayVersionId: version.id, id: { [Op.notIn]: [...keptSlotIds, 0] } }, transaction })
    }
  }
  await PlanDayModel.destroy({ where: { planId: plan.id, id: { [Op.notIn]: [...keptDayIds, 0] } }, transaction })
}

export async function createPlan(owner: UserModel, input: PlanInput): Promise<Plan> {
  const sequelize = PlanModel.sequelize!
  const id = await sequelize.transaction(async (transaction) => {
    await assertUsableExercises(owner, input.days, transaction)
    const plan = await PlanModel.create({ ownerId: owner.id, name: input.name, splitKind: input.splitKind, archivedAt: null }, { transaction })
    await writeDays(plan, input.days.map((d) => ({ ...d, id: undefined, versions: { I: d.versions.I.map((s) => ({ ...s, id: undefined })), II: d.versions.II.map((s) => ({ ...s, id: undefined })) } })), transaction)
    return plan.id
  })
  return toPlan((await loadPlan(id))!)
}

export async function updatePlan(viewer: UserModel, id: number, input: PlanInput): Promise<Plan> {
  await PlanModel.sequelize!.transaction(async (transaction) => {
    const plan = await ownedPlan(viewer, id, transaction)
    await assertUsableExercises(viewer, input.days, transaction)
    await plan.update({ name: input.name, splitKind: input.splitKind }, { transaction })
    await writeDays(plan, input.days, transaction)
    plan.changed('updatedAt', true)
    await plan.save({ transaction })
  })
  return toPlan((await loadPlan(id))!)
}

export async function patchPlan(viewer: UserModel, id: number, input: UpdatePlanInput): Promise<Plan> {
  const plan = await ownedPlan(viewer, id)
  await plan.update({
    ...(input.name !== undefined ? { name: input.name } : {}),
    ...(input.archived !== undefined ? { archivedAt: input.archived ? new Date() : null } : {}),
  })
  return toPlan((await loadPlan(id))!)
}

/** Copies the author's own plan (an athlete on it may read it, not copy it); slots get new ids and start without history. */
export async function duplicatePlan(viewer: UserModel, id: number): Promise<Plan> {
  const source = toPlan(await ownedPlan(viewer, id))
  return createPlan(viewer, {
    name: `${source.name} (copy)`.slice(0, 80),
    splitKind: source.splitKind,
    days: source.days.map((d) => ({
      name: d.name,
      isRest: d.isRest,
      versions: {
        I: d.versions.I.map((s) => ({ exerciseId: s.exerciseId, role: s.role, scheme: s.scheme, restSec: s.restSec })),
        II: d.versions.II.map((s) => ({ exerciseId: s.exerciseId, role: s.role, scheme: s.scheme, restSec: s.restSec })),
      },
    })),
  })
}

export function listTemplates() {
  return PLAN_TEMPLATES.map((t) => ({ id: t.id, name: t.name, splitKind: t.splitKind, description: t.description, days: t.days.map((d) => d.name) }))
}

/** A new plan from a split template, its exercises matched in the library by name (or else by pattern). */
export async function createFromTemplate(owner: UserModel, input: PlanFromTemplateInput): Promise<Plan> {
  const template = PLAN_TEMPLATES.find((t) => t.id === input.templateId)
  if (!template) throw AppError.badRequest('Unknown template', [{ path: 'templateId', message: 'Pick one of the templates' }])
  const library = await ExerciseModel.findAll({ where: { ownerId: null }, order: [['name', 'ASC']] })
  const pick = (name: string, pattern: string) => {
    const exercise = library.find((e) => e.name === name) ?? library.find((e) => e.pattern === pattern)
    if (!exercise) throw AppError.conflict('library_incomplete', `The exercise library has no ${pattern.replaceAll('_', ' ')} exercise`)
    return exercise.id
  }
  return createPlan(owner, {
    name: input.name ?? template.name,
    splitKind: template.splitKind,
    days: template.days.map((day) => ({
      name: day.name,
      isRest: day.isRest,
      versions: {
        I: day.slots.map((s) => ({ exerciseId: pick(s.I, s.pattern), role: s.role, scheme: s.scheme, restSec: DEFAULT_REST_SECONDS[s.role] })),
        II: day.slots.map((s) => ({ exerciseId: pick(s.II, s.pattern), role: s.role, scheme: s.scheme, restSec: DEFAULT_REST_SECONDS[s.role] })),
      },
    })),
  })
}

/**
 * Assigns the plan to athletes from a start date: a coach to their own athletes, a lifter to
 * themself. Each athlete's earlier assignment ends; the new one starts at the first day.
 */
export async function assignPlan(viewer: UserModel, id: number, input: AssignPlanInput) {
  const plan = await ownedPlan(viewer, id)
  if (plan.archivedAt) throw AppError.conflict('plan_archived', 'Restore the plan before assigning it')
  for (const athleteId of input.athleteIds) {
    const allowed = viewer.role === 'lifter' ? athleteId === viewer.id : viewer.role === 'coach' && (await isCoachOf(viewer.id, athleteId))
    if (!allowed) throw AppError.forbidden(viewer.role === 'lifter' ? 'A lifter can assign a plan only to themself' : 'You can assign plans only to your own athletes')
  }
  await PlanModel.sequelize!.transaction(async (transaction) => {
    await AssignmentModel.update({ active: false }, { where: { athleteId: input.athleteIds, active: true }, transaction })
    await AssignmentModel.bulkCreate(
      input.athleteIds.map((athleteId) => ({ athleteId, planId: plan.id, startDate: input.startDate, rotationIndex: 0, active: true })),
      { transaction },
    )
  })
  return { planId: plan.id, athleteIds: input.athleteIds, startDate: input.startDate }
}

/**
 * A proposal to rotate one day's version to fresh exercises of the same patterns, keeping the
 * other version as it is. For each slot: an exercise of the same pattern that neither version of
 * that day uses, preferring one the plan does not use at all.
 */
export async function proposeRotation(viewer: UserModel, id: number, input: RotateVersionInput): Promise<RotationProposal> {
  const plan = toPlan(await ownedPlan(viewer, id))
  const day = plan.days.find((d) => d.id === input.dayId)
  if (!day || day.isRest) throw AppError.badRequest('Pick a training day of this plan', [{ path: 'dayId', message: 'Not a training day of this plan' }])
  const usedInPlan = new Set(plan.days.flatMap((d) => [...d.versions.I, ...d.versions.II].map((s) => s.exerciseId)))
  const library = await ExerciseModel.findAll({ where: { [Op.or]: [{ ownerId: null }, { ownerId: viewer.id }] }, order: [['name', 'ASC']] })
  const other = input.version === 'I' ? 'II' : 'I'
  const asRotation = (s: Slot): RotationSlot => ({ slotId: s.id, pattern: s.pattern, exerciseId: s.exerciseId })
  const chosen = freshExercisesFor(day.versions[input.version].map(asRotation), day.versions[other].map(asRotation), usedInPlan, library)
  const names = new Map(library.map((e) => [e.id, e.name]))
  const swaps = chosen.map((c) => ({
    slotId: c.slotId,
    fromExerciseId: c.fromExerciseId,
    fromName: day.versions[input.version].find((s) => s.id === c.slotId)!.exerciseName,
    toExerciseId: c.toExerciseId,
    toName: names.get(c.toExerciseId) ?? '',
  }))
  return { dayId: day.id, version: input.version, swaps }
}

/** Applies a rotation the user confirmed: only the named slots of that day's version change. */
export async function applyRotation(viewer: UserModel, id: number, input: ApplyRotationInput): Promise<Plan> {
  await PlanModel.sequelize!.transaction(async (transaction) => {
    const plan = toPlan(await ownedPlan(viewer, id, transaction))
    const day = plan.days.find((d) => d.id === input.dayId)
    if (!day) throw AppError.badRequest('Pick a day of this plan', [{ path: 'dayId', message: 'Not a day of this plan' }])
    for (const swap of input.swaps) {
      const slot = day.versions[input.version].find((s) => s.id === swap.slotId)
      if (!slot) throw AppError.badRequest('Unknown slot', [{ path: 'swaps', message: `Slot ${swap.slotId} is not in version ${input.version} of ${day.name}` }])
      const to = await ExerciseModel.findOne({ where: { id: swap.toExerciseId, [Op.or]: [{ ownerId: null }, { ownerId: viewer.id }] }, transaction })
      if (!to || to.pattern !== slot.pattern) {
        throw AppError.badRequest('Rotate to an exercise of the same pattern', [{ path: 'swaps', message: `Pick a ${slot.pattern.replaceAll('_', ' ')} exercise` }])
      }
      await SlotModel.update({ exerciseId: to.id }, { where: { id: slot.id }, transaction })
    }
  })
  return getPlan(viewer, id)
}
