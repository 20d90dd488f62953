import { randomUUID } from 'node:crypto'
import bcrypt from 'bcryptjs'
import type { CreationAttributes, Transaction } from 'sequelize'
import type { Equipment } from '@shared/domain/equipment'
import { defaultGym, equipmentFor, type ExerciseEquipmentKind, type GymProfile } from '@shared/domain/gym'
import { movedLoadKg, type LoadMode } from '@shared/domain/lift-progress'
import { COMPOUND_PATTERNS } from '@shared/domain/plan-checks'
import { planSlotSets } from '@shared/domain/planned-sets'
import type { Exposure, PerformedSet } from '@shared/domain/progression'
import { rotationEntry } from '@shared/domain/rotation'
import { backoffTarget, DEFAULT_REST_SECONDS } from '@shared/domain/schemes'
import type { AppConfig } from '../../config'
import { storeReviewSummary } from '../../services/run.service'
import { parseScheme } from '../../services/session-planning.service'
import {
  AssignmentModel, BodyWeightModel, ClubModel, CoachAthleteModel, DayVersionModel, EquipmentProfileModel, ExerciseModel,
  PlanDayModel, PlanModel, SessionModel, SetLogModel, SlotModel, UserModel,
} from '../index'
import { DEMO_ACCOUNTS, DEMO_CLUB_NAME, DEMO_PASSWORD } from './demo-accounts'
import { demoE1rmKg, PUSH_PULL_LEGS, UPPER_LOWER, type DemoPlan } from './demo-plans'
import { exerciseLibrary } from './exercise-library'
import { mulberry32 } from './prng'
import { simulatedSet } from './simulated-lifter'

export { DEMO_PASSWORD } from './demo-accounts'

const DAY_MS = 24 * 60 * 60 * 1000
export const DEMO_HISTORY_DAYS = 70

/** How each invented demo lifter trains: strength relative to the table, weekly gain, attendance. */
interface DemoLifterProfile {
  strength: number
  /** Body mass (kg), for bodyweight lifts and the body-weight log. */
  bodyMassKg: number
  weeklyGainPct: number
  attendance: number
  /** Lifts that stopped improving, so the plateau tools have something to find. */
  stalled: string[]
  seed: number
}

type SlotRow = { slot: SlotModel; exercise: ExerciseModel }
type DayRow = { day: PlanDayModel; versions: { I: SlotRow[]; II: SlotRow[] } }

async function createPlan(ownerId: number, plan: DemoPlan, exercises: Map<string, ExerciseModel>, transaction: Transaction) {
  const planRow = await PlanModel.create({ ownerId, name: plan.name, splitKind: plan.splitKind, archivedAt: null }, { transaction })
  const days: DayRow[] = []
  for (const [position, day] of plan.days.entries()) {
    const dayRow = await PlanDayModel.create({ planId: planRow.id, position, name: day.name, isRest: day.isRest ?? false }, { transaction })
    const versions = { I: [] as SlotRow[], II: [] as SlotRow[] }
    for (const label of ['I', 'II'] as const) {
      const version = await DayVersionModel.create({ planDayId: dayRow.id, label }, { transaction })
      for (const [slotPosition, slot] of (day.versions?.[label] ?? []).entries()) {
        const exercise = exercises.get(slot.exercise)
        if (!exercise) throw new Error(`Demo plan names an exercise that is not in the library: ${slot.exercise}`)
        const slotRow = await SlotModel.create(
          {
            dayVersionId: version.id, exerciseId: exercise.id, position: slotPosition, role: slot.role,
            scheme: slot.scheme, restSec: DEFAULT_REST_SECONDS[slot.role],
          },
          { transaction },
        )
        versions[label].push({ slot: slotRow, exercise })
      }
    }
    days.push({ day: dayRow, versions })
  }
  return { plan: planRow, days }
}

/**
 * Six weeks of plausible training for one lifter: follows the plan's rotation (rest days pass,
 * missed days do not skip ahead), plans every slot with the engine from what was done before
 * (warm-up ramps, next steps taken as the lifter would with "Take all"), and works out each
 * back-off set from the top set done. The lifter's true strength and the reps it allows come
 * from simulated-lifter.ts.
 */
async function simulateHistory(
  athlete: UserModel,
  assignment: AssignmentModel,
  days: DayRow[],
  gym: GymProfile,
  profile: DemoLifterProfile,
  now: Date,
  transaction: Transaction,
) {
  const random = mulberry32(profile.seed)
  const exposures = new Map<number, Exposure[]>() // slot id -> exposures, oldest first
  const start = new Date(now.getTime() - DEMO_HISTORY_DAYS * DAY_MS)
  let rotationIndex = 0
  const setRows: CreationAttributes<SetLogModel>[] = []

  for (let d = 0; d < DEMO_HISTORY_DAYS; d++) {
    const dayStart = new Date(start.getTime() + d * DAY_MS)
    const entry = rotationEntry(rotationIndex, days.length)
    const { day, versions } = days[entry.dayIndex]
    if (day.isRest) {
      rotationIndex += 1
      continue
    }
    if (random() > profile.attendance) continue // a missed day: the same session waits for tomorrow

    const weeks = d / 7
    const bodyMassKg = profile.bodyMassKg
    const startedAt = new Date(dayStart.getTime() + (17 + Math.floor(random() * 3)) * 3600_000)
    const session = await SessionModel.create(
      {
        athleteId: athlete.id, assignmentId: assignment.id, planDayId: day.id, dayName: day.name,
        versionLabel: entry.version, status: 'completed', startedAt, completedAt: null, summary: null, note: null,
        rotationIndex,
      },
      { transaction },
    )
    const sessionSets: CreationAttributes<SetLogModel>[] = []
    let clock = startedAt.getTime()
    const warmedPatterns = new Set<string>()
    for (const { slot, exercise } of versions[entry.version]) {
      const equipment: Equipment = equipmentFor(gym, exercise.equipmentKind as ExerciseEquipmentKind)
      const mode = (exercise.loadMode ?? 'external') as LoadMode
      const gain = profile.stalled.includes(exercise.name) ? 0 : profile.weeklyGainPct / 100
      const e1rm = demoE1rmKg(exercise.name, bodyMassKg) * profile.strength * (1 + gain * weeks)
      const history = exposures.get(slot.id) ?? []
      const planned = planSlotSets({
        role: slot.role, scheme: parseScheme(slot.scheme), equipment, mode, bodyMassKg, history,
        // A first session starts from the coach's estimate, a little under the lifter's strength.
        startE1rmKg: e1rm * 0.95, restSeconds: slot.restSec,
        compound: slot.role === 'compound_primary' || COMPOUND_PATTERNS.has(exercise.pattern),
        patternWarmedUp: warmedPatterns.has(exercise.pattern),
      })
      warmedPatterns.add(exercise.pattern)
      const reading = { mode, bodyMassKg }
      const done: PerformedSet[] = []
      for (const set of planned) {
        const row = {
          id: randomUUID(), sessionId: session.id, exerciseId: exercise.id, slotId: slot.id, role: slot.role,
          position: sessionSets.length, kind: set.kind, targetRepsMin: set.targetRepsMin, targetRepsMax: set.targetRepsMax,
          targetReps: set.targetReps, toFailure: set.toFailure, targetRir: set.targetRir, note: null,
        }
        if (set.kind === 'warmup') {
          clock += 90_000
          sessionSets.push({ ...row, targetLoadKg: set.targetLoadKg, loadKg: set.targetLoadKg, reps: set.targetRepsMax, rir: null, failure: false, loggedAt: new Date(clock) })
          continue
        }
        const targetKg = set.kind === 'backoff'
          ? backoffTarget({ topLoadKg: done[0].loadKg, topReps: done[0].reps, repsMin: set.targetRepsMin, repsMax: set.targetRepsMax, equipment, reading }).target.loadKg
          : set.targetLoadKg!
        const result = simulatedSet({ e1rmKg: e1rm, movedKg: movedLoadKg(targetKg, reading) ?? targetKg, setsBefore: done.length, set, noise: random() })
        done.push({
          kind: set.kind, loadKg: targetKg, reps: result.reps, repsMin: set.targetRepsMin, repsMax: set.targetRepsMax, rir: result.rir,
          targetLoadKg: set.kind === 'backoff' ? targetKg : set.targetLoadKg, targetReps: set.targetReps, targetRir: set.targetRir,
        })
        clock += set.restSeconds * 1000 + 45_000
        sessionSets.push({ ...row, targetLoadKg: targetKg, loadKg: targetKg, reps: result.reps, rir: result.rir, failure: set.toFailure, loggedAt: new Date(clock) })
      }
      exposures.set(slot.id, [...history, { sets: done, bodyMassKg }])
    }
    const completedAt = new Date(clock + 120_000)
    await session.update({ completedAt }, { transaction })
    setRows.push(...sessionSets)
    rotationIndex += 1
  }
  await SetLogModel.bulkCreate(setRows, { transaction })
  await assignment.update({ rotationIndex }, { transaction })
}

/** Loads the invented demo club into an empty database. */
export async function seedDemo(config: AppConfig, now = new Date()) {
  const sequelize = UserModel.sequelize!
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, config.bcryptCost)
  await sequelize.transaction(async (transaction) => {
    const club = await ClubModel.create({ name: DEMO_CLUB_NAME }, { transaction })
    const users = {} as Record<keyof typeof DEMO_ACCOUNTS, UserModel>
    for (const [key, account] of Object.entries(DEMO_ACCOUNTS) as Array<[keyof typeof DEMO_ACCOUNTS, (typeof DEMO_ACCOUNTS)[keyof typeof DEMO_ACCOUNTS]]>) {
      users[key] = await UserModel.create(
        { ...account, passwordHash, clubId: club.id, cautionsAcknowledgedAt: null },
        { transaction },
      )
    }
    const athletes = [users.lifterKg, users.lifterLb, users.lifterAdvanced]
    await CoachAthleteModel.bulkCreate(athletes.map((a) => ({ coachId: users.coach.id, athleteId: a.id })), { transaction })

    const exerciseRows = await ExerciseModel.bulkCreate(exerciseLibrary.map((e) => ({ ...e, ownerId: null })), { transaction })
    const exercises = new Map(exerciseRows.map((e) => [e.name, e]))

    const gyms = new Map<number, GymProfile>()
    for (const athlete of athletes) {
      const gym = defaultGym(athlete.unit)
      gyms.set(athlete.id, gym)
      await EquipmentProfileModel.create(
        { userId: athlete.id, name: athlete.unit === 'lb' ? 'Pound gym' : 'Kilogram gym', spec: gym, isDefault: true },
        { transaction },
      )
    }

    const ppl = await createPlan(users.coach.id, PUSH_PULL_LEGS, exercises, transaction)
    const upperLower = await createPlan(users.coach.id, UPPER_LOWER, exercises, transaction)
    const startDate = new Date(now.getTime() - DEMO_HISTORY_DAYS * DAY_MS).toISOString().slice(0, 10)
    const plans = [
      { athlete: users.lifterKg, plan: ppl, profile: { strength: 1, bodyMassKg: 63, weeklyGainPct: 0.6, attendance: 0.8, stalled: [], seed: 11 } },
      { athlete: users.lifterLb, plan: upperLower, profile: { strength: 0.75, bodyMassKg: 84, weeklyGainPct: 1.5, attendance: 0.7, stalled: [], seed: 22 } },
      {
        athlete: users.lifterAdvanced,
        plan: ppl,
        profile: { strength: 1.45, bodyMassKg: 71, weeklyGainPct: 0.25, attendance: 0.9, stalled: ['Barbell bench press'], seed: 33 },
      },
    ]
    for (const { athlete, plan, profile } of plans) {
      // A body-weight entry every week of the history (steady, for the demo).
      await BodyWeightModel.bulkCreate(
        Array.from({ length: DEMO_HISTORY_DAYS / 7 + 1 }, (_, w) => ({
          userId: athlete.id,
          measuredOn: new Date(now.getTime() - (DEMO_HISTORY_DAYS - 7 * w) * DAY_MS).toISOString().slice(0, 10),
          weightKg: profile.bodyMassKg,
        })),
        { transaction },
      )
      const assignment = await AssignmentModel.create({ athleteId: athlete.id, planId: plan.plan.id, startDate }, { transaction })
      await simulateHistory(athlete, assignment, plan.days, gyms.get(athlete.id)!, profile, now, transaction)
    }
  })
  // The review desk's flags and records, as the server stores them when each session is finished.
  for (const athlete of await UserModel.findAll({ where: { role: 'lifter' } })) {
    for (const session of await SessionModel.findAll({ where: { athleteId: athlete.id, status: 'completed' } })) {
      await storeReviewSummary(session, athlete)
    }
  }
}

export async function seedDemoIfEmpty(config: AppConfig, now = new Date()): Promise<boolean> {
  if ((await UserModel.count()) > 0) return false
  await seedDemo(config, now)
  return true
}

/** `npm run seed`: empties every table, then loads the demo club. */
export async function resetAndSeedDemo(config: AppConfig, now = new Date()) {
  const sequelize = UserModel.sequelize!
  const tables = [
    'body_weights', 'uploads', 'comments', 'reviews', 'next_steps', 'set_logs', 'sessions', 'assignments',
    'slots', 'day_versions', 'plan_days', 'plans', 'equipment_profiles', 'exercises', 'invites',
    'coach_athletes', 'password_resets', 'users', 'clubs',
  ]
  await sequelize.transaction(async (transaction) => {
    for (const table of tables) await sequelize.getQueryInterface().bulkDelete(table, {}, { transaction })
  })
  await seedDemo(config, now)
}
