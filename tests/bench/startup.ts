/**
 * 6. Start-up and install size: time from starting the production server to its first
 * successful health check on an existing database (the demo club and the large club), and the
 * size of the production node_modules (`npm ls --omit=dev`).
 */
import { execFileSync } from 'node:child_process'
import { mkdtempSync } from 'node:fs'
import { join } from 'node:path'
import { budget, median, type BenchContext, type BenchPart } from './bench-types'
import { largeDatabaseCopy } from './large-db'
import { startProductionServer } from './production-server'

const RUNS = 5

async function startTimes(ctx: BenchContext, databasePath: string, label: string) {
  const times: number[] = []
  for (let i = 0; i < RUNS; i++) {
    const server = await startProductionServer(ctx.distDir, databasePath, join(ctx.workDir, `startup-${label}.log`))
    times.push(server.startMs)
    await server.stop()
  }
  return times
}

/** Bytes of the packages `npm ci --omit=dev` would install, read from the installed tree. */
function productionNodeModules(root: string) {
  const paths = execFileSync('npm', ['ls', '--omit=dev', '--all', '--parseable'], { cwd: root, encoding: 'utf8', maxBuffer: 64 << 20 })
    .split('\n')
    .filter((p) => p.includes('/node_modules/'))
  const unique = [...new Set(paths)]
  // Nested node_modules folders are listed as packages of their own, so leave them out of each du.
  const out = execFileSync('du', ['-scb', '--exclude=node_modules', ...unique], { encoding: 'utf8', maxBuffer: 64 << 20 })
  const total = Number(/(\d+)\s+total\s*$/.exec(out)?.[1])
  const allOut = execFileSync('du', ['-sb', join(root, 'node_modules')], { encoding: 'utf8' })
  return { packages: unique.length, bytes: total, allBytes: Number(allOut.split('\t')[0]) }
}

export async function run(ctx: BenchContext): Promise<BenchPart> {
  // An existing demo database: the first start seeds it, the timed starts find it there.
  const demoDir = mkdtempSync(join(ctx.workDir, 'startup-demo-'))
  const demoDb = join(demoDir, 'demo.sqlite')
  const first = await startProductionServer(ctx.distDir, demoDb, join(ctx.workDir, 'startup-first.log'))
  const firstStartMs = first.startMs
  await first.stop()
  ctx.log('startup: demo database')
  const demo = await startTimes(ctx, demoDb, 'demo')
  ctx.log('startup: large database')
  const { path: largeDb } = await largeDatabaseCopy(ctx, 'startup-large')
  const large = await startTimes(ctx, largeDb, 'large')
  const modules = productionNodeModules(ctx.root)
  const mb = (b: number) => (b / 1024 / 1024).toFixed(1)
  const markdown = [
    `\`node dist/server/index.js\` (what \`npm start\` runs after its build step) until the first 200 from /api/health, median of ${RUNS} starts, health polled every 10 ms.`,
    '',
    '| Database | median ms | min ms | max ms |',
    '|---|---:|---:|---:|',
    `| Demo club, existing | ${median(demo).toFixed(0)} | ${Math.min(...demo).toFixed(0)} | ${Math.max(...demo).toFixed(0)} |`,
    `| Large club (150 athletes × 2 years), existing | ${median(large).toFixed(0)} | ${Math.min(...large).toFixed(0)} | ${Math.max(...large).toFixed(0)} |`,
    '',
    `The very first start on an empty database (migrations plus loading the demo club) took ${firstStartMs.toFixed(0)} ms.`,
    '',
    `Production node_modules (\`npm ls --omit=dev --all\`): ${modules.packages} packages, ${mb(modules.bytes)} MB on disk (sqlite3 compiled from source included); the full development install is ${mb(modules.allBytes)} MB.`,
  ].join('\n')
  return {
    title: '6. Start-up and install size',
    command: 'npm run bench -- --only startup',
    markdown,
    figures: { runs: RUNS, demoMs: demo, largeMs: large, firstStartMs, productionNodeModules: modules },
    budgets: [],
  }
}
