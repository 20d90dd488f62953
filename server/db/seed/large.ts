import { QueryTypes } from 'sequelize'
import type { Database, Statement } from 'sqlite3'
import type { Equipment } from '@shared/domain/equipment'
import { defaultGym, equipmentFor, type ExerciseEquipmentKind, type GymProfile } from '@shared/domain/gym'
import { movedLoadKg, type LoadMode } from '@shared/domain/lift-progress'
import { reportLift } from '@shared/domain/lift-report'
import { COMPOUND_PATTERNS } from '@shared/domain/plan-checks'
import { planSlotSets } from '@shared/domain/planned-sets'
import type { Exposure, PerformedSet } from '@shared/domain/progression'
import type { LoadReps } from '@shared/domain/records'
import { reviewFlags, type ReviewBlock } from '@shared/domain/review-flags'
import { rotationEntry, todayInRotation } from '@shared/domain/rotation'
import { backoffTarget, DEFAULT_SCHEMES, setSchemeSchema, type SetScheme, type SlotRole } from '@shared/domain/schemes'
import { sessionTotals, type SummarisableSet } from '@shared/domain/summary'
import { loadConfig, type AppConfig } from '../../config'
import {
  AssignmentModel, ClubModel, CoachAthleteModel, DayVersionModel, enlargePageCache, EquipmentProfileModel, ExerciseModel,
  openDatabase, PlanDayModel, PlanModel, SlotModel, UserModel,
} from '../index'
import { migrate } from '../migrate'
import { DEMO_ACCOUNTS, DEMO_CLUB_NAME } from './demo-accounts'
import { demoE1rmKg, PUSH_PULL_LEGS, UPPER_LOWER } from './demo-plans'
import { resetAndSeedDemo } from './demo'
import { mulberry32 } from './prng'
import { simulatedSet } from './simulated-lifter'

/**
 * The large benchmark scenario (`npm run seed:large`): the demo club plus many invented
 * athletes, all coached by the demo coach, each with up to two years of training on one of the
 * club's plans. Built for speed: the whole history is simulated in memory with the engine, and
 * written with multi-row prepared INSERTs inside one transaction. The stored columns the
 * screens read (session totals, the review desk's flags, record counts) are computed from the
 * same simulation instead of being re-read per session, as the normal demo seed does.
 *
 * Deterministic: the same options and `now` give the same rows (ids included).
 */

export interface LargeSeedOptions {
  /** Invented athletes to add (default 150). */
  athletes?: number
  /** Weeks of history per athlete (default 104, two years). */
  weeks?: number
  /** The end of the history (default: now). */
  now?: Date
  /** PRNG seed (default 2024). */
  seed?: number
  /** Progress lines. */
  log?: (line: string) => void
}

export interface LargeSeedResult {
  athletes: number
  sessions: number
  sets: number
  reviews: number
  comments: number
  bodyWeights: number
  ms: number
}

const DAY_MS = 86_400_000
const BLOCK_STRIDE = 100 // as the runner numbers sets: block i at positions i*100 ..
const EXPOSURES_KEPT = 8 // as historyFor keeps them for the review flags
export const LARGE_EMAIL_DOMAIN = 'harbourstreet.example'

/** Neutral invented first names; with a last initial they name no one in particular. */
const FIRST_NAMES = [
  'Alex', 'Sam', 'Jordan', 'Robin', 'Taylor', 'Casey', 'Morgan', 'Jamie', 'Riley', 'Avery', 'Quinn', 'Rowan',
  'Sasha', 'Kai', 'Noa', 'Eli', 'Mika', 'Jules', 'Remy', 'Ari', 'Dana', 'Toby', 'Nico', 'Lou', 'Billie', 'Sky',
  'Reese', 'Emery', 'Hayden', 'Parker',
]
const INITIALS = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ'
const COACH_REMARKS = [
  'Good bar speed on the top set.',
  'Keep the rest clock honest on the back-off.',
  'Depth looked consistent today.',
  'Next time hold the pause at the bottom.',
  'Nice jump in reps, keep it there.',
  'Brace before each rep, not just the first.',
]

export function largeAthleteEmail(index: number) {
  return `athlete${String(index + 1).padStart(3, '0')}@${LARGE_EMAIL_DOMAIN}`
}

export function largeAthleteName(index: number) {
  const first = FIRST_NAMES[index % FIRST_NAMES.length]
  const round = Math.floor(index / FIRST_NAMES.length)
  const initial = INITIALS[(round * 9 + (index % FIRST_NAMES.length)) % 26]
  const suffix = round >= 26 ? ` ${Math.floor(round / 26) + 1}` : ''
  return `${first} ${initial}.${suffix}`
}

const TWO = Array.from({ length: 60 }, (_, i) => String(i).padStart(2, '0'))
const THREE = Array.from({ length: 1000 }, (_, i) => String(i).padStart(3, '0'))
const HEX = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, '0'))
const dayTexts = new Map<number, string>()

const sqlDay = (ms: number) => {
  const day = Math.floor(ms / DAY_MS)
  let text = dayTexts.get(day)
  if (text === undefined) dayTexts.set(day, (text = new Date(day * DAY_MS).toISOString().slice(0, 10)))
  return text
}

/**
 * Sequelize's SQLite date text ('2026-11-30 18:00:00.000 +00:00'), so ranges compare as the
 * app's do; built by hand because a million `toISOString()` calls are a large share of the run.
 */
function sqlDate(ms: number) {
  const whole = Math.round(ms)
  let rest = whole - Math.floor(whole / DAY_MS) * DAY_MS
  const hours = Math.floor(rest / 3_600_000)
  rest -= hours * 3_600_000
  const minutes = Math.floor(rest / 60_000)
  rest -= minutes * 60_000
  const seconds = Math.floor(rest / 1000)
  return `${sqlDay(whole)} ${TWO[hours]}:${TWO[minutes]}:${TWO[seconds]}.${THREE[rest - seconds * 1000]} +00:00`
}

/** A version-4 UUID from the PRNG (version and variant bits set), so set ids repeat run to run. */
function uuidFrom(random: () => number) {
  const a = (random() * 2 ** 32) >>> 0
  const b = (random() * 2 ** 32) >>> 0
  const c = (random() * 2 ** 32) >>> 0
  const d = (random() * 2 ** 32) >>> 0
  const x = (word: number, byte: number) => HEX[(word >>> (24 - 8 * byte)) & 0xff]
  return (
    `${x(a, 0)}${x(a, 1)}${x(a, 2)}${x(a, 3)}-${x(b, 0)}${x(b, 1)}-${HEX[(((b >>> 8) & 0xff) & 0x0f) | 0x40]}${x(b, 3)}-` +
    `${HEX[((c >>> 24) & 0x3f) | 0x80]}${x(c, 1)}-${x(c, 2)}${x(c, 3)}${x(d, 0)}${x(d, 1)}${x(d, 2)}${x(d, 3)}`
  )
}

/**
 * Writes run one after another on the connection while the next rows are simulated: the
 * simulation (JavaScript) and SQLite (the sqlite3 worker thread) use the two cores at once.
 * At most two writes wait; order is kept, so a parent row is always written before its children.
 */
class WriteQueue {
  private pending: Promise<void>[] = []

  async enqueue(write: () => Promise<void>) {
    if (this.pending.length >= 2) await this.pending.shift()
    const previous = this.pending.at(-1) ?? Promise.resolve()
    const next = previous.then(write)
    next.catch(() => {}) // reported to whoever awaits it
    this.pending.push(next)
  }

  async drain() {
    while (this.pending.length > 0) await this.pending.shift()
  }
}

/**
 * Multi-row INSERTs prepared once on the transaction's own SQLite connection, with positional
 * (`?`) parameters bound from arrays, in chunks under SQLite's variable limit. (Sequelize's
 * `bind` turns arrays into named parameters, which SQLite looks up one by one: far too slow
 * for a million rows.)
 */
class BulkWriter {
  private rows: unknown[][] = []
  private statement: Statement | null = null
  written = 0
  constructor(
    private db: Database,
    private queue: WriteQueue,
    private table: string,
    private columns: string[],
    /** Tables this one references: flushed first, so foreign keys hold at every statement. */
    private dependsOn: BulkWriter[] = [],
    private chunk = Math.floor(30_000 / columns.length),
  ) {}

  async add(row: unknown[]) {
    this.rows.push(row)
    if (this.rows.length >= this.chunk) await this.flush()
  }

  private sql(rowCount: number) {
    const tuple = `(${this.columns.map(() => '?').join(',')})`
    return `INSERT INTO ${this.table} (${this.columns.join(',')}) VALUES ${Array(rowCount).fill(tuple).join(',')}`
  }

  private prepare(sql: string) {
    return new Promise<Statement>((resolve, reject) => {
      const statement = this.db.prepare(sql, (err) => (err ? reject(err) : resolve(statement)))
    })
  }

  private async write(rowCount: number, params: unknown[]) {
    try {
      const full = rowCount === this.chunk
      const statement = full ? (this.statement ??= await this.prepare(this.sql(rowCount))) : await this.prepare(this.sql(rowCount))
      await new Promise<void>((resolve, reject) => statement.run(params, (err) => (err ? reject(err) : resolve())))
      if (!full) await new Promise<void>((resolve) => statement.finalize(() => resolve()))
    } catch (err) {
      // The statement is huge: say which table failed and why, not the SQL text.
      throw new Error(`Bulk insert into ${this.table} failed: ${(err as Error).message}`)
    }
  }

  async flush() {
    if (this.rows.length === 0) return
    for (const other of this.dependsOn) await other.flush()
    const rowCount = this.rows.length
    const params = this.rows.flat()
    this.rows = []
    this.written += rowCount
    await this.queue.enqueue(() => this.write(rowCount, params))
  }

  /** Queues what is left; the statement is finalised once the queue has drained. */
  async finish() {
    await this.flush()
    await this.queue.enqueue(async () => {
      const statement = this.statement
      this.statement = null
      if (statement) await new Promise<void>((resolve) => statement.finalize(() => resolve()))
    })
  }
}

interface SlotInfo {
  id: number
  role: SlotRole
  scheme: SetScheme
  restSec: number
  exercise: ExerciseModel
}
interface DayInfo {
  id: number
  name: string
  isRest: boolean
  versions: { I: SlotInfo[]; II: SlotInfo[] }
}
interface PlanInfo {
  id: number
  days: DayInfo[]
}

async function loadPlan(coachId: number, name: string): Promise<PlanInfo> {
  const plan = await PlanModel.findOne({ where: { ownerId: coachId, name } })
  if (!plan) throw new Error(`The demo plan "${name}" is missing: load the demo club first (npm run seed)`)
  const days = await PlanDayModel.findAll({
    where: { planId: plan.id },
    order: [['position', 'ASC']],
    include: [{ model: DayVersionModel, as: 'versions', include: [{ model: SlotModel, as: 'slots', include: [{ model: ExerciseModel, as: 'exercise' }] }] }],
  })
  return {
    id: plan.id,
    days: days.map((day) => {
      const versionSlots = (label: 'I' | 'II') =>
        [...(day.versions?.find((v) => v.label === label)?.slots ?? [])]
          .sort((a, b) => a.position - b.position)
          .map((slot) => {
            const parsed = setSchemeSchema.safeParse(slot.scheme)
            return { id: slot.id, role: slot.role, scheme: parsed.success ? parsed.data : DEFAULT_SCHEMES[slot.role], restSec: slot.restSec, exercise: slot.exercise! }
          })
      return { id: day.id, name: day.name, isRest: day.isRest, versions: { I: versionSlots('I'), II: versionSlots('II') } }
    }),
  }
}

/** Weekday patterns (0 = Monday) for three and four training days a week. */
const WEEK_PATTERNS = [[0, 2, 4], [1, 3, 5], [0, 2, 5], [0, 1, 3, 4], [0, 2, 4, 5], [1, 2, 4, 6]]

interface SimulationContext {
  writers: Record<'sessions' | 'sets' | 'reviews' | 'comments' | 'bodyWeights', BulkWriter>
  ids: () => number
  coachId: number
  today: number
  now: number
  historyStart: number
  weeks: number
  nextSessionId: number
  totals: Omit<LargeSeedResult, 'athletes' | 'ms'>
}

/**
 * Up to `weeks` weeks of one athlete's training, written as rows; returns the rotation index
 * their assignment ends at. Follows the plan's rotation as the app does (todayInRotation; a
 * rest day trained means the next training day), plans every slot with the engine from the
 * slot's last exposures, and computes the stored summary (totals, review flags, records) of
 * each session from the same simulation.
 */
async function simulateAthlete(ctx: SimulationContext, athlete: UserModel, assignment: AssignmentModel, plan: PlanInfo, random: () => number) {
  const { writers, totals, today, weeks } = ctx
  const gym: GymProfile = defaultGym(athlete.unit)
  const restFlags = plan.days.map((d) => d.isRest)
  // An invented profile (made-up ranges, no published source): level, how much and how fast
  // they gain, how often they come, habits.
  const strength = 0.6 + random() * 0.9
  const maxGain = 0.12 + random() * 0.35
  const tauWeeks = 30 + random() * 50
  const attendance = 0.78 + random() * 0.2
  const pattern = WEEK_PATTERNS[Math.floor(random() * WEEK_PATTERNS.length)]
  const hour = 6 + Math.floor(random() * 14)
  const rirShare = [0, 0.5, 1][Math.floor(random() * 3)] // some rate reserve on every set, some never
  const hurried = random() < 0.15 // starts sets before the rest clock is up now and then
  const mainLift = plan.days.find((d) => !d.isRest)!.versions.I[0].exercise.name
  const stallFromWeek = random() < 0.4 ? weeks * (0.5 + random() * 0.4) : Infinity
  const missedWeeks = new Set<number>()
  // One to three breaks of a week or two in two years (fewer in a shorter history).
  for (let b = 0, blocks = Math.max(1, Math.round(((1 + Math.floor(random() * 3)) * weeks) / 104)); b < blocks; b++) {
    const start = Math.floor(random() * weeks)
    const length = 1 + Math.floor(random() * 2)
    for (let w = start; w < start + length; w++) missedWeeks.add(w)
  }
  let bodyWeight = 55 + random() * 45
  const bodyTrend = (random() - 0.4) * 0.08 // kg a week

  const exposures = new Map<number, Exposure[]>() // slot id -> last exposures, oldest first
  const bestSets = new Map<number, LoadReps[]>() // exercise id -> best reps at each load so far
  let rotationIndex = 0
  let last: { day: number; rotationIndex: number } | null = null
  let lastMissedWeek = -10

  for (let w = 0; w < weeks; w++) {
    const weekStart = ctx.historyStart + w * 7 * DAY_MS
    if (random() < 0.7) {
      bodyWeight += bodyTrend + (random() - 0.5) * 0.6
      const at = sqlDate(weekStart + 6 * DAY_MS + 8 * 3_600_000)
      await writers.bodyWeights.add([athlete.id, sqlDay(weekStart + 6 * DAY_MS), Math.round(bodyWeight * 10) / 10, at, at])
      totals.bodyWeights += 1
    }
    if (missedWeeks.has(w)) {
      lastMissedWeek = w
      continue
    }
    for (const weekday of pattern) {
      const day = Math.floor(weekStart / DAY_MS) + weekday
      if (day * DAY_MS >= today) break
      if (random() > attendance) continue
      const t = todayInRotation(rotationIndex, restFlags, last ? day - last.day : null)
      const entry = t.isRest ? t.nextTraining! : t
      const planDay = plan.days[entry.dayIndex]
      const slots = planDay.versions[entry.version]
      const weeksIn = w + weekday / 7
      // Strength: quick early gains that level off, a dip after time off, day-to-day form
      // (an invented curve for the demo, no published source).
      const detrain = w - lastMissedWeek < 4 ? 1 - 0.05 * (1 - (w - lastMissedWeek) / 4) : 1
      const dayForm = 1 + (random() - 0.5) * 0.06
      const startedAt = Math.round(day * DAY_MS + (hour + random()) * 3_600_000)
      const startedText = sqlDate(startedAt)
      let clock = startedAt
      const cutShortAfter = random() < 0.03 ? Math.max(1, slots.length - 2) : slots.length
      const sessionId = ctx.nextSessionId++
      const setRows: unknown[][] = [] // written after the session row
      const blocks: ReviewBlock[] = []
      const rests: Array<{ plannedSec: number; actualSec: number }> = []
      const working: SummarisableSet[] = []
      let records = 0
      let volume = 0
      let topSetId: string | null = null

      const warmedPatterns = new Set<string>()
      const patternSets = new Map<string, number>()
      const doneByBlock: Array<{ slot: (typeof slots)[number]; done: PerformedSet[]; history: Exposure[]; equipment: Equipment; mode: LoadMode; reviewPlanned: ReviewBlock['planned'] }> = []
      for (let blockIndex = 0; blockIndex < slots.length; blockIndex++) {
        const slot = slots[blockIndex]
        const equipment: Equipment = equipmentFor(gym, slot.exercise.equipmentKind as ExerciseEquipmentKind)
        const mode = (slot.exercise.loadMode ?? 'external') as LoadMode
        const reading = { mode, bodyMassKg: bodyWeight }
        const gainWeeks = slot.exercise.name === mainLift ? Math.min(weeksIn, stallFromWeek) : weeksIn
        const e1rm = demoE1rmKg(slot.exercise.name, bodyWeight) * strength * (1 + maxGain * (1 - Math.exp(-gainWeeks / tauWeeks))) * detrain * dayForm
        const history = exposures.get(slot.id) ?? []
        const planned = planSlotSets({
          role: slot.role, scheme: slot.scheme, equipment, mode, bodyMassKg: bodyWeight, history,
          startE1rmKg: e1rm * 0.95, restSeconds: slot.restSec,
          compound: slot.role === 'compound_primary' || COMPOUND_PATTERNS.has(slot.exercise.pattern),
          patternWarmedUp: warmedPatterns.has(slot.exercise.pattern),
        })
        warmedPatterns.add(slot.exercise.pattern)
        const done: PerformedSet[] = []
        const reviewPlanned: ReviewBlock['planned'] = []
        let lastWorkingAt: number | null = null
        for (const set of planned) {
          const id = uuidFrom(ctx.ids)
          const position = blockIndex * BLOCK_STRIDE + set.position
          if (blockIndex >= cutShortAfter) {
            // The session ended early: the rest of the plan stays as skipped sets.
            setRows.push([
              id, sessionId, slot.exercise.id, slot.id, position, set.kind, set.targetLoadKg, set.targetRepsMin, set.targetRepsMax,
              set.targetReps, set.toFailure ? 1 : 0, set.targetRir, null, null, null, 0, null, null, 1, null, slot.role, startedText, startedText,
            ])
            if (set.kind !== 'warmup') reviewPlanned.push({ kind: set.kind, repsMin: set.targetRepsMin, repsMax: set.targetRepsMax, done: null })
            continue
          }
          if (set.kind === 'warmup') {
            clock += 90_000
            const at = sqlDate(clock)
            setRows.push([
              id, sessionId, slot.exercise.id, slot.id, position, 'warmup', set.targetLoadKg, set.targetRepsMin, set.targetRepsMax,
              set.targetReps, 0, null, set.targetLoadKg, set.targetRepsMax, null, 0, null, at, 0, at, slot.role, startedText, at,
            ])
            continue
          }
          const targetKg = set.kind === 'backoff'
            ? backoffTarget({ topLoadKg: done[0].loadKg, topReps: done[0].reps, repsMin: set.targetRepsMin, repsMax: set.targetRepsMax, equipment, reading }).target.loadKg
            : set.targetLoadKg!
          const result = simulatedSet({ e1rmKg: e1rm, movedKg: movedLoadKg(targetKg, reading) ?? targetKg, setsBefore: done.length, set, noise: random() })
          const reps = result.reps
          // Some lifters rate their reserve on every set, some never.
          const rir = set.toFailure ? 0 : random() < rirShare ? result.rir : null
          done.push({
            kind: set.kind, loadKg: targetKg, reps, repsMin: set.targetRepsMin, repsMax: set.targetRepsMax, rir,
            targetLoadKg: targetKg, targetReps: set.targetReps, targetRir: set.toFailure ? null : set.targetRir,
          })
          reviewPlanned.push({ kind: set.kind, repsMin: set.targetRepsMin, repsMax: set.targetRepsMax, done: { loadKg: targetKg, reps } })
          // A set takes about 45 s; a hurried lifter now and then starts the next one early.
          clock += Math.round(hurried && random() < 0.4 ? set.restSeconds * 250 + 20_000 : set.restSeconds * 1000 * (0.85 + random() * 0.5) + 45_000)
          if (lastWorkingAt !== null) rests.push({ plannedSec: slot.restSec, actualSec: (clock - lastWorkingAt) / 1000 })
          lastWorkingAt = clock
          if (set.kind === 'top') topSetId = id
          working.push({ kind: set.kind, loadKg: targetKg, reps })
          const at = sqlDate(clock)
          setRows.push([
            id, sessionId, slot.exercise.id, slot.id, position, set.kind, targetKg, set.targetRepsMin, set.targetRepsMax,
            set.targetReps, set.toFailure ? 1 : 0, set.targetRir, targetKg, reps, rir, set.toFailure ? 1 : 0, null, at, 0, at, slot.role, startedText, at,
          ])
        }
        patternSets.set(slot.exercise.pattern, (patternSets.get(slot.exercise.pattern) ?? 0) + done.length)
        doneByBlock.push({ slot, done, history, equipment, mode, reviewPlanned })
      }
      // Each lift's report as the server makes it when the session is finished (session-report.service.ts).
      for (const { slot, done, history, equipment, mode, reviewPlanned } of doneByBlock) {
        const best = bestSets.get(slot.exercise.id) ?? []
        const report = reportLift({
          role: slot.role,
          version: entry.version,
          lift: { equipment, mode, loadStepKg: null },
          history,
          current: { sets: done, bodyMassKg: bodyWeight },
          recordHistory: best,
          patternSetsInSession: patternSets.get(slot.exercise.pattern) ?? 0,
        })
        blocks.push({ exercise: slot.exercise.name, planned: reviewPlanned, lift: report })
        records += report.records.length
        volume += report.volumeKg
        for (const d of done) {
          const atLoad = best.find((b) => b.loadKg === d.loadKg)
          if (!atLoad) best.push({ loadKg: d.loadKg, reps: d.reps })
          else if (d.reps > atLoad.reps) atLoad.reps = d.reps
        }
        bestSets.set(slot.exercise.id, best)
        if (done.length > 0) exposures.set(slot.id, [...history.slice(-(EXPOSURES_KEPT - 1)), { sets: done, bodyMassKg: bodyWeight }])
      }

      const completedAt = clock + 120_000
      let restDaysBetween = 0
      if (last) for (let r = last.rotationIndex + 1; r < entry.rotationIndex; r++) if (restFlags[rotationEntry(r, restFlags.length).dayIndex]) restDaysBetween += 1
      const flags = reviewFlags({ blocks, rests, daysSincePrevious: last ? day - last.day : null, restDaysBetween })
      const completedText = sqlDate(completedAt)
      await writers.sessions.add([
        sessionId, athlete.id, assignment.id, planDay.id, planDay.name, entry.version, 'completed', startedText, completedText,
        JSON.stringify({ workingSets: sessionTotals(working).workingSets, volumeKg: volume, flags, records }), null, entry.rotationIndex, startedText, completedText,
      ])
      for (const row of setRows) await writers.sets.add(row)
      totals.sessions += 1
      // The coach has reviewed most of the older sessions and few of the last three weeks.
      if (random() < (today - day * DAY_MS > 21 * DAY_MS ? 0.9 : 0.3)) {
        const reviewedAt = Math.round(completedAt + (2 + random() * 40) * 3_600_000)
        if (reviewedAt < ctx.now) {
          const reviewedText = sqlDate(reviewedAt)
          await writers.reviews.add([sessionId, ctx.coachId, reviewedText, reviewedText, reviewedText])
          totals.reviews += 1
          if (random() < 0.08) {
            const remark = COACH_REMARKS[Math.floor(random() * COACH_REMARKS.length)]
            const commentText = sqlDate(reviewedAt - 60_000)
            await writers.comments.add([sessionId, random() < 0.5 ? topSetId : null, ctx.coachId, remark, commentText, commentText])
            totals.comments += 1
          }
        }
      }
      rotationIndex = entry.rotationIndex + 1
      last = { day, rotationIndex: entry.rotationIndex }
    }
  }
  return rotationIndex
}

/**
 * Adds the large scenario to a database that already holds the demo club (seedDemo). Runs on
 * the open connection, like seedDemo.
 */
export async function seedLarge(_config: AppConfig, options: LargeSeedOptions = {}): Promise<LargeSeedResult> {
  const started = Date.now()
  const athleteCount = options.athletes ?? 150
  const weeks = options.weeks ?? 104
  const now = options.now ?? new Date()
  const seed = options.seed ?? 2024
  const log = options.log ?? (() => {})
  const sequelize = UserModel.sequelize!

  const coach = await UserModel.findOne({ where: { email: DEMO_ACCOUNTS.coach.email } })
  const club = await ClubModel.findOne({ where: { name: DEMO_CLUB_NAME } })
  if (!coach || !club) throw new Error('The demo club is missing: load it first (npm run seed)')
  if ((await UserModel.count({ where: { email: largeAthleteEmail(0) } })) > 0) throw new Error('The large scenario is loaded already')
  const plans = [await loadPlan(coach.id, PUSH_PULL_LEGS.name), await loadPlan(coach.id, UPPER_LOWER.name)]

  // The history ends yesterday evening; it starts on a Monday `weeks` weeks before.
  const today = Math.floor(now.getTime() / DAY_MS) * DAY_MS
  const mondayOffset = (new Date(today).getUTCDay() + 6) % 7
  const historyStart = today - mondayOffset * DAY_MS - weeks * 7 * DAY_MS
  const ids = mulberry32(seed ^ 0x5eed5)

  const totals: SimulationContext['totals'] = { sessions: 0, sets: 0, reviews: 0, comments: 0, bodyWeights: 0 }
  await sequelize.transaction(async (transaction) => {
    // The set table's indexes stay in memory while most of a million rows go in.
    await enlargePageCache(sequelize, transaction, 256)
    const users = await UserModel.bulkCreate(
      Array.from({ length: athleteCount }, (_, i) => ({
        name: largeAthleteName(i), email: largeAthleteEmail(i), passwordHash: coach.passwordHash, role: 'lifter' as const,
        unit: mulberry32(seed + i)() < 0.25 ? ('lb' as const) : ('kg' as const), clubId: club.id, cautionsAcknowledgedAt: new Date(historyStart),
      })),
      { transaction },
    )
    await CoachAthleteModel.bulkCreate(users.map((u) => ({ coachId: coach.id, athleteId: u.id })), { transaction })
    await EquipmentProfileModel.bulkCreate(
      users.map((u) => ({ userId: u.id, name: u.unit === 'lb' ? 'Pound gym' : 'Kilogram gym', spec: defaultGym(u.unit), isDefault: true })),
      { transaction },
    )
    const assignments = await AssignmentModel.bulkCreate(
      users.map((u, i) => ({ athleteId: u.id, planId: plans[i % 2].id, startDate: sqlDay(historyStart) })),
      { transaction },
    )
    const [{ next }] = await sequelize.query<{ next: number }>('SELECT COALESCE(MAX(id), 0) + 1 AS next FROM sessions', { transaction, type: QueryTypes.SELECT })
    // The transaction's own connection (the pool holds one): the raw INSERTs run inside it.
    const db = (transaction as unknown as { connection: Database }).connection
    const queue = new WriteQueue()
    const sessions = new BulkWriter(db, queue, 'sessions', [
      'id', 'athlete_id', 'assignment_id', 'plan_day_id', 'day_name', 'version_label', 'status', 'started_at', 'completed_at',
      'summary', 'note', 'rotation_index', 'created_at', 'updated_at',
    ])
    const sets = new BulkWriter(db, queue, 'set_logs', [
      'id', 'session_id', 'exercise_id', 'slot_id', 'position', 'kind', 'target_load_kg', 'target_reps_min', 'target_reps_max',
      'target_reps', 'to_failure', 'target_rir', 'load_kg', 'reps', 'rir', 'failure', 'note', 'logged_at', 'skipped', 'edited_at',
      'role', 'created_at', 'updated_at',
    ], [sessions])
    const writers = {
      sessions,
      sets,
      reviews: new BulkWriter(db, queue, 'reviews', ['session_id', 'coach_id', 'reviewed_at', 'created_at', 'updated_at'], [sessions]),
      comments: new BulkWriter(db, queue, 'comments', ['session_id', 'set_log_id', 'author_id', 'body', 'created_at', 'updated_at'], [sessions, sets]),
      bodyWeights: new BulkWriter(db, queue, 'body_weights', ['user_id', 'measured_on', 'weight_kg', 'created_at', 'updated_at']),
    }
    const context: SimulationContext = { writers, ids, coachId: coach.id, today, now: now.getTime(), historyStart, weeks, nextSessionId: next, totals }
    for (const [i, athlete] of users.entries()) {
      const rotationIndex = await simulateAthlete(context, athlete, assignments[i], plans[i % 2], mulberry32(seed * 1_000 + i + 1))
      await assignments[i].update({ rotationIndex }, { transaction })
      if ((i + 1) % 25 === 0 || i + 1 === users.length) {
        log(`  ${i + 1}/${users.length} athletes, ${totals.sessions} sessions (${((Date.now() - started) / 1000).toFixed(1)} s)`)
      }
    }
    for (const writer of Object.values(writers)) await writer.finish()
    await queue.drain()
    totals.sets = sets.written
  })
  return { athletes: athleteCount, ...totals, ms: Date.now() - started }
}

/**
 * For the benchmarks: makes `databasePath` hold the demo club plus the large scenario (the
 * database is migrated and emptied first). Opens its own connection and closes it again, so the
 * caller opens the database afterwards (the models are bound to one connection at a time).
 */
export async function seedLargeDemo(
  databasePath: string,
  opts: LargeSeedOptions = {},
): Promise<{ athletes: number; sessions: number; sets: number; ms: number }> {
  const started = Date.now()
  const config = loadConfig({ ...process.env, DATABASE_PATH: databasePath, BCRYPT_COST: '10', SEED_DEMO: 'false' })
  const sequelize = await openDatabase(config.databasePath)
  try {
    await migrate(sequelize)
    await resetAndSeedDemo(config, opts.now)
    const result = await seedLarge(config, opts)
    return { athletes: result.athletes, sessions: result.sessions, sets: result.sets, ms: Date.now() - started }
  } finally {
    await sequelize.close()
  }
}
