/**
 * 5. Engine: runs `npm run bench:engine` in its own process (so nothing else in this process
 * skews it) and reports the medians it wrote to bench/out/engine.json.
 */
import { spawnSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { budget, type BenchContext, type BenchPart } from './bench-types'

interface EngineReport {
  logbook: { sets: number; exercises: number; nextStepsPerRun: number }
  medians: { logbookNextStepsMs: number; rampMs: number; rampPerLoadFromBatchMs: number }
  budgets: { logbookNextStepsMs: number; rampMs: number }
}

export async function run(ctx: BenchContext): Promise<BenchPart> {
  ctx.log('engine: npm run bench:engine')
  const out = spawnSync('npm', ['run', '--silent', 'bench:engine'], { cwd: ctx.root, encoding: 'utf8' })
  if (out.status !== 0) throw new Error(`bench:engine failed:\n${out.stdout}\n${out.stderr}`)
  const report = JSON.parse(readFileSync(join(ctx.root, 'bench/out/engine.json'), 'utf8')) as EngineReport
  const m = report.medians
  const markdown = [
    `tinybench, medians, in its own Node process.`,
    '',
    '| Task | median ms | budget |',
    '|---|---:|---:|',
    `| Next steps + plateau check for a five-year logbook (${report.logbook.sets.toLocaleString('en')} sets, ${report.logbook.exercises} exercises) | ${m.logbookNextStepsMs.toFixed(2)} | < ${report.budgets.logbookNextStepsMs} ms |`,
    `| One warm-up ramp (plates per side, fewest plate changes) | ${m.rampMs.toFixed(3)} | < ${report.budgets.rampMs} ms |`,
    `| Warm-up ramp, per load over a batch of 1,000 loads | ${m.rampPerLoadFromBatchMs.toFixed(3)} | < ${report.budgets.rampMs} ms |`,
  ].join('\n')
  return {
    title: '5. Training engine',
    command: 'npm run bench:engine',
    markdown,
    figures: report as unknown as Record<string, unknown>,
    budgets: [
      budget({ name: 'Engine: next steps for a five-year logbook', value: m.logbookNextStepsMs, limit: report.budgets.logbookNextStepsMs, unit: 'ms', kind: 'max', strict: true }),
      budget({ name: 'Engine: one warm-up ramp', value: m.rampMs, limit: report.budgets.rampMs, unit: 'ms', kind: 'max', strict: true }),
    ],
  }
}
