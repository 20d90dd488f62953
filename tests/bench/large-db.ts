import { copyFileSync, existsSync } from 'node:fs'
import { join } from 'node:path'
import type { BenchContext } from './bench-types'

let template: Promise<{ path: string }> | undefined

async function seed(path: string) {
  // Loaded lazily: only the parts that need the large club pay for Sequelize and the seed.
  const { seedLargeDemo } = await import('../../server/db/seed/large')
  // A smaller club for a quick try of the benchmark code itself; the report prints the real counts.
  const athletes = process.env.BENCH_LARGE_ATHLETES ? Number(process.env.BENCH_LARGE_ATHLETES) : undefined
  const weeks = process.env.BENCH_LARGE_WEEKS ? Number(process.env.BENCH_LARGE_WEEKS) : undefined
  return seedLargeDemo(path, { athletes, weeks })
}

/**
 * The large demo club (`npm run seed:large`: 150 athletes with two years each), seeded once
 * per benchmark run. Each caller gets its own copy, because the API part writes sets into it.
 */
export async function largeDatabaseCopy(ctx: BenchContext, name: string) {
  template ??= (async () => {
    // A club seeded earlier (`npm run seed:large`), for repeated tries of one part: not re-seeded.
    const reused = process.env.BENCH_LARGE_TEMPLATE
    if (reused) {
      ctx.log(`large demo club: reusing ${reused} (BENCH_LARGE_TEMPLATE)`)
      return { path: reused }
    }
    const path = join(ctx.workDir, 'large-template.sqlite')
    ctx.log('seeding the large demo club (150 athletes, two years each)...')
    const seeded = await seed(path)
    ctx.log(`seeded: ${JSON.stringify(seeded)}`)
    return { path }
  })()
  const { path } = await template
  const copy = join(ctx.workDir, `${name}.sqlite`)
  // No connection is open on the template, so the file (and a write-ahead log, if one was left) is whole.
  copyFileSync(path, copy)
  if (existsSync(path + '-wal')) copyFileSync(path + '-wal', copy + '-wal')
  return { path: copy }
}
