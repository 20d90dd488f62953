/**
 * 5. Engine: runs `npm run bench:engine` in its own process (so nothing else in this process
 * skews it) three times and reports, per task, the median of the three runs' medians. One run's
 * median moved between 14 and 105 ms on the same code on one of these VMs; the single runs are
 * listed beside it. A budget it misses is reported as FAIL, not as a failed benchmark.
 */
import { spawnSync } from 'node:child_process'
import { readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { budget, median, type BenchContext, type BenchPart } from './bench-types'

const RUNS = 3

interface EngineReport {
  logbook: { sets: number; exercises: number; nextStepsPerRun: number }
  medians: { logbookNextStepsMs: number; rampMs: number; rampPerLoadFromBatchMs: number }
  budgets: { logbookNextStepsMs: number; rampMs: number }
}

export async function run(ctx: BenchContext): Promise<BenchPart> {
  const file = join(ctx.root, 'bench/out/engine.json')
  const runs: EngineReport[] = []
  for (let i = 1; i <= RUNS; i++) {
    ctx.log(`engine: npm run bench:engine (${i}/${RUNS})`)
    const started = Date.now()
    const out = spawnSync('npm', ['run', '--silent', 'bench:engine'], { cwd: ctx.root, encoding: 'utf8' })
    // Exit code 1 with a fresh report is a missed budget; anything else is a broken benchmark.
    const written = statSync(file, { throwIfNoEntry: false })
    const fresh = out.status !== null && out.status <= 1 && written !== undefined && written.mtimeMs >= started
    if (!fresh) throw new Error(`bench:engine failed:\n${out.stdout}\n${out.stderr}`)
    runs.push(JSON.parse(readFileSync(file, 'utf8')) as EngineReport)
  }
  const report = runs[0]!
  const of = (k: keyof EngineReport['medians']) => median(runs.map((r) => r.medians[k]))
  const m = { logbookNextStepsMs: of('logbookNextStepsMs'), rampMs: of('rampMs'), rampPerLoadFromBatchMs: of('rampPerLoadFromBatchMs') }
  const singles = (k: keyof EngineReport['medians'], digits: number) => runs.map((r) => r.medians[k].toFixed(digits)).join(', ')
  const markdown = [
    `tinybench, medians, each run in its own Node process; ${RUNS} runs, and the figure is the median of their medians.`,
    '',
    '| Task | median ms | single runs | budget |',
    '|---|---:|---|---:|',
    `| Next steps + plateau check for a five-year logbook (${report.logbook.sets.toLocaleString('en')} sets, ${report.logbook.exercises} exercises) | ${m.logbookNextStepsMs.toFixed(2)} | ${singles('logbookNextStepsMs', 2)} | < ${report.budgets.logbookNextStepsMs} ms |`,
    `| One warm-up ramp (plates per side, fewest plate changes) | ${m.rampMs.toFixed(3)} | ${singles('rampMs', 3)} | < ${report.budgets.rampMs} ms |`,
    `| Warm-up ramp, per load over a batch of 1,000 loads | ${m.rampPerLoadFromBatchMs.toFixed(3)} | ${singles('rampPerLoadFromBatchMs', 3)} | < ${report.budgets.rampMs} ms |`,
  ].join('\n')
  return {
    title: '5. Training engine',
    command: 'npm run bench:engine',
    markdown,
    figures: { ...report, medians: m, runs: runs.map((r) => r.medians) } as unknown as Record<string, unknown>,
    budgets: [
      budget({ name: 'Engine: next steps for a five-year logbook', value: m.logbookNextStepsMs, limit: report.budgets.logbookNextStepsMs, unit: 'ms', kind: 'max', strict: true }),
      budget({ name: 'Engine: one warm-up ramp', value: m.rampMs, limit: report.budgets.rampMs, unit: 'ms', kind: 'max', strict: true }),
    ],
  }
}
