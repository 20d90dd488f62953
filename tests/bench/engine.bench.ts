/**
 * Training engine benchmark: `npm run bench:engine`.
 *
 * 1. Next steps for a generated five-year logbook (about 60,000 sets over 40 exercises):
 *    a next step for every working set of every exposure plus plateau detection per
 *    exercise. Budget: under 20 ms for the whole logbook.
 * 2. The warm-up ramp optimiser for 1,000 random working loads. Budget: under 2 ms per ramp.
 *
 * The logbook is generated deterministically from a seeded PRNG. Medians are printed with
 * PASS/FAIL and written to bench/out/engine.json.
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Bench } from 'tinybench'
import {
  DEFAULT_SCHEMES,
  KG_COMPETITION_SET,
  LB_GYM_SET,
  detectPlateau,
  doubleProgressionAt,
  lbToKg,
  roundDownToLoadable,
  stepUp,
  warmupRamp,
  type Equipment,
  type Exposure,
  type PerformedSet,
  type SlotRole,
} from '../../shared/domain/index'
import { mulberry32 } from '../../server/db/seed/prng'


const DUMBBELLS: Equipment = { kind: 'dumbbell', unit: 'kg', pairs: Array.from({ length: 30 }, (_, i) => 2.5 * (i + 1)) }
const CABLE: Equipment = { kind: 'stack', unit: 'kg', steps: Array.from({ length: 24 }, (_, i) => 5 * (i + 1)), addOns: [{ mass: 1.25, count: 2 }] }

interface ExerciseLog {
  role: SlotRole
  equipment: Equipment
  exposures: Exposure[]
}

const EXERCISES = 40
const TARGET_SETS = 60_000

function generateLogbook(seed: number): ExerciseLog[] {
  const rand = mulberry32(seed)
  const roles: SlotRole[] = Array.from({ length: EXERCISES }, (_, i) => (i < 10 ? 'compound_primary' : i < 25 ? 'accessory' : 'isolation'))
  const setsPerRound = roles.reduce((n, r) => n + DEFAULT_SCHEMES[r].sets.length, 0)
  const exposuresEach = Math.ceil(TARGET_SETS / setsPerRound) // about 630 per exercise: ~2.4 a week for 5 years
  return roles.map((role, i) => {
    const equipment = role === 'compound_primary' ? (i % 2 ? LB_GYM_SET : KG_COMPETITION_SET) : role === 'accessory' ? DUMBBELLS : CABLE
    const scheme = DEFAULT_SCHEMES[role].sets
    let load = roundDownToLoadable(role === 'compound_primary' ? 60 + rand() * 60 : 10 + rand() * 20, equipment).loadKg
    let reps = scheme[0].repsMin
    const exposures: Exposure[] = []
    for (let e = 0; e < exposuresEach; e++) {
      const sets: PerformedSet[] = scheme.map((s, j) => {
        const setLoad = j === 0 ? load : roundDownToLoadable(load * (1 - 0.1 * j), equipment).loadKg
        const done = Math.max(1, Math.min(50, s.repsMin + Math.floor(rand() * (s.repsMax - s.repsMin + 3)) - 1))
        return { kind: s.kind, loadKg: setLoad, reps: j === 0 ? reps : done, repsMin: s.repsMin, repsMax: s.repsMax }
      })
      exposures.push({ sets })
      // the lifter mostly follows double progression, sometimes stalls or misses
      const r = rand()
      if (r < 0.6) {
        if (reps >= scheme[0].repsMax) {
          const up = stepUp(load, equipment)
          if (up) load = up.loadKg
          reps = scheme[0].repsMin
        } else reps++
      } else if (r < 0.7 && reps > 1) reps--
      if (load > 250) load = roundDownToLoadable(150, equipment).loadKg
    }
    return { role, equipment, exposures }
  })
}

const logbook = generateLogbook(20_261_201)
const totalSets = logbook.reduce((n, x) => n + x.exposures.reduce((m, e) => m + e.sets.length, 0), 0)

/** A next step for every working set of every exposure (the rule reads the last three exposures), and a plateau check per exercise. */
function logbookNextSteps(): number {
  let steps = 0
  for (const ex of logbook) {
    const lift = { equipment: ex.equipment }
    for (let i = 0; i < ex.exposures.length; i++) {
      const recent = ex.exposures.slice(Math.max(0, i - 2), i + 1)
      for (let j = 0; j < ex.exposures[i].sets.length; j++) if (doubleProgressionAt(recent, j, lift)) steps++
    }
    if (detectPlateau(ex.exposures, { role: ex.role, equipment: ex.equipment }).plateau) steps++
  }
  return steps
}

const rampRand = mulberry32(42)
const rampLoads = Array.from({ length: 1000 }, () => {
  const pound = rampRand() < 0.5
  return pound
    ? { equipment: LB_GYM_SET, workingKg: lbToKg(95 + rampRand() * 400) }
    : { equipment: KG_COMPETITION_SET, workingKg: 40 + rampRand() * 200 }
})
let rampIndex = 0

const BUDGET_LOGBOOK_MS = 20
const BUDGET_RAMP_MS = 2

async function main(): Promise<void> {
  // sanity: the work is real
  const stepsPerRun = logbookNextSteps()
  const bench = new Bench({ time: 2000, warmupTime: 300 })
  bench.add(`next steps, 5-year logbook (${totalSets} sets, ${EXERCISES} exercises)`, () => {
    logbookNextSteps()
  })
  bench.add('warm-up ramp optimiser, one ramp (cycling 1,000 random working loads)', () => {
    const x = rampLoads[rampIndex++ % rampLoads.length]
    warmupRamp(x.workingKg, x.equipment)
  })
  bench.add('warm-up ramp optimiser, all 1,000 working loads', () => {
    for (const x of rampLoads) warmupRamp(x.workingKg, x.equipment)
  })
  await bench.run()

  const median = (i: number): number => {
    const r = bench.tasks[i].result
    if (r.state !== 'completed') throw new Error(`${bench.tasks[i].name}: ${r.state}`)
    return r.latency.p50
  }
  const logbookMs = median(0)
  const rampMs = median(1)
  const thousandRampsMs = median(2)
  const rows = [
    { task: bench.tasks[0].name, medianMs: logbookMs, budgetMs: BUDGET_LOGBOOK_MS },
    { task: bench.tasks[1].name, medianMs: rampMs, budgetMs: BUDGET_RAMP_MS },
    { task: `${bench.tasks[2].name} (per ramp)`, medianMs: thousandRampsMs / rampLoads.length, budgetMs: BUDGET_RAMP_MS },
  ]
  for (const r of rows) {
    const verdict = r.medianMs < r.budgetMs ? 'PASS' : 'FAIL'
    console.log(`${verdict}  ${r.task}: median ${r.medianMs.toFixed(4)} ms (budget < ${r.budgetMs} ms)`)
  }
  console.log(`(${stepsPerRun} next steps per logbook run; 1,000 ramps median ${thousandRampsMs.toFixed(2)} ms)`)

  const root = join(dirname(fileURLToPath(import.meta.url)), '../..')
  const outDir = join(root, 'bench/out')
  mkdirSync(outDir, { recursive: true })
  const report = {
    generatedAt: new Date().toISOString(),
    node: process.version,
    logbook: { sets: totalSets, exercises: EXERCISES, nextStepsPerRun: stepsPerRun },
    medians: {
      logbookNextStepsMs: logbookMs,
      rampMs,
      thousandRampsMs,
      rampPerLoadFromBatchMs: thousandRampsMs / rampLoads.length,
    },
    budgets: { logbookNextStepsMs: BUDGET_LOGBOOK_MS, rampMs: BUDGET_RAMP_MS },
    pass: { logbookNextSteps: logbookMs < BUDGET_LOGBOOK_MS, ramp: rampMs < BUDGET_RAMP_MS },
  }
  writeFileSync(join(outDir, 'engine.json'), `${JSON.stringify(report, null, 2)}\n`)
  console.log(`wrote ${join(outDir, 'engine.json')}`)
  if (!report.pass.logbookNextSteps || !report.pass.ramp) process.exitCode = 1
}

void main()
