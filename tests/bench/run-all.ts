/**
 * `npm run bench`: builds the app, runs every benchmark part one after another, and writes
 * bench/report.md and bench/report.json.
 *
 *   npm run bench                      all parts (about 17 minutes on 2 cores)
 *   npm run bench -- --only api,load   some parts (names below)
 *   npm run bench -- --no-build        reuse dist/ as it is
 *
 * Budgets from the issue are printed as PASS/FAIL; the exit code is 1 when one fails, so a
 * regression is loud. A run of some parts only updates their sections in the report.
 */
import { execFileSync, spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { cpus, totalmem, tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { BenchContext, BenchPart } from './bench-types'

const PARTS = {
  'page-weight': () => import('./page-weight'),
  lighthouse: () => import('./lighthouse'),
  'train-load': () => import('./train-load'),
  interaction: () => import('./interaction'),
  api: () => import('./api'),
  load: () => import('./load'),
  sql: () => import('./sql'),
  engine: () => import('./engine'),
  startup: () => import('./startup'),
} satisfies Record<string, () => Promise<{ run: (ctx: BenchContext) => Promise<BenchPart> }>>
type PartName = keyof typeof PARTS

interface StoredPart extends BenchPart {
  name: PartName
  measuredAt: string
}
interface StoredReport {
  parts: StoredPart[]
}

const root = resolve(fileURLToPath(new URL('../..', import.meta.url)))
const args = process.argv.slice(2)
const onlyArg = args.find((a, i) => args[i - 1] === '--only') ?? args.find((a) => a.startsWith('--only='))?.slice(7)
const only = onlyArg ? (onlyArg.split(',') as PartName[]) : (Object.keys(PARTS) as PartName[])
for (const name of only) if (!(name in PARTS)) throw new Error(`unknown part "${name}": one of ${Object.keys(PARTS).join(', ')}`)

const log = (line: string) => process.stderr.write(`[bench] ${line}\n`)
const distDir = resolve(process.env.CHALKLINE_DIST ?? join(root, 'dist'))
if (!args.includes('--no-build')) {
  log('npm run build')
  const built = spawnSync('npm', ['run', 'build'], { cwd: root, stdio: ['ignore', 'ignore', 'inherit'] })
  if (built.status !== 0) process.exit(built.status ?? 1)
}
const workDir = mkdtempSync(join(tmpdir(), 'chalkline-bench-'))
const ctx: BenchContext = { root, distDir, workDir, cores: cpus().length, log }

const reportJson = join(root, 'bench/report.json')
const previous: StoredReport = existsSync(reportJson) ? JSON.parse(readFileSync(reportJson, 'utf8')) : { parts: [] }
const fresh: StoredPart[] = []
try {
  for (const name of only) {
    log(`part: ${name}`)
    const started = performance.now()
    const part = await (await PARTS[name]()).run(ctx)
    log(`part: ${name} done in ${((performance.now() - started) / 1000).toFixed(0)} s`)
    fresh.push({ ...part, name, measuredAt: new Date().toISOString() })
  }
} finally {
  rmSync(workDir, { recursive: true, force: true })
}

// Parts not run this time keep their last figures (with their own date).
const order = Object.keys(PARTS) as PartName[]
const parts = order
  .map((name) => fresh.find((p) => p.name === name) ?? previous.parts.find((p) => p.name === name))
  .filter((p): p is StoredPart => p !== undefined)

const commit = execFileSync('git', ['rev-parse', '--short', 'HEAD'], { cwd: root, encoding: 'utf8' }).trim()
const cpu = cpus()[0]?.model ?? 'unknown CPU'
const machine = `${ctx.cores} cores (${cpu}), ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}, ${process.platform}`
const budgets = parts.flatMap((p) => p.budgets.map((b) => ({ ...b, part: p.title })))
const fmt = (v: number) => (Math.abs(v) >= 100 ? v.toFixed(0) : v.toFixed(2))
const md = [
  '# Chalkline benchmark report',
  '',
  `Written by \`npm run bench\` (tests/bench/run-all.ts). Machine: ${machine}. Commit ${commit}.`,
  'Figures vary by machine: compare ratios where a baseline is given, and rerun the command on yours.',
  '',
  '## Budgets',
  '',
  '| | Measure | Value | Budget | Section |',
  '|---|---|---:|---:|---|',
  ...budgets.map(
    (b) => `| ${b.pass ? 'PASS' : '**FAIL**'} | ${b.name} | ${fmt(b.value)} ${b.unit} | ${b.kind === 'max' ? (b.strict ? '<' : '≤') : b.strict ? '>' : '≥'} ${b.limit} ${b.unit} | ${b.part} |`,
  ),
  '',
  ...parts.flatMap((p) => [
    `## ${p.title}`,
    '',
    `Measured ${p.measuredAt.slice(0, 16).replace('T', ' ')} UTC${p.command ? ` · rerun: \`${p.command}\`` : ''}`,
    '',
    p.markdown,
    '',
  ]),
].join('\n')

mkdirSync(join(root, 'bench'), { recursive: true })
writeFileSync(join(root, 'bench/report.md'), md)
writeFileSync(reportJson, `${JSON.stringify({ machine, commit, parts }, null, 2)}\n`)
for (const b of budgets) log(`${b.pass ? 'PASS' : 'FAIL'}  ${b.name}: ${fmt(b.value)} ${b.unit} (budget ${b.kind === 'max' ? '≤' : '≥'} ${b.limit} ${b.unit})`)
log('wrote bench/report.md and bench/report.json')
if (budgets.some((b) => !b.pass)) process.exitCode = 1
