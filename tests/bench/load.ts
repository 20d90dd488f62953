/**
 * Load run (issue 8): a bounded autocannon run on loopback at a fixed rate for 60 s with the
 * lifters' and the coach's usual mix, sampling the server's resident memory every second.
 * Zero errors, and memory after the warm-up may not grow beyond a set bound.
 *
 * Run alone: `tsx tests/bench/load.ts` (needs a build in dist/, or CHALKLINE_DIST).
 */
import autocannon from 'autocannon'
import { budget, type BenchContext, type BenchPart } from './bench-types'
import { authed, nextSetRequest, openApiWorld } from './api'

const RATE = 200
const DURATION_S = 60
const WARM_UP_S = 10
/** How much resident memory may grow between the end of the warm-up and the end of the run. */
const GROWTH_BOUND_MB = 48

export async function run(ctx: BenchContext): Promise<BenchPart> {
  const world = await openApiWorld(ctx, 'load')
  const samples: { s: number; rssMb: number }[] = []
  try {
    const { server } = world
    let turn = 0
    const lifter = () => world.lifters[turn++ % world.lifters.length]!
    const put: autocannon.Request = {
      method: 'PUT',
      setupRequest: (req) => {
        const l = lifter()
        return { ...req, ...nextSetRequest(l), headers: authed(l.token, {}) }
      },
    }
    const today: autocannon.Request = {
      method: 'GET',
      setupRequest: (req) => ({ ...req, path: `/api/train/today?date=${world.today}&tzOffset=0`, headers: authed(lifter().token) }),
    }
    const athletes: autocannon.Request = { method: 'GET', path: '/api/athletes', headers: authed(world.coachToken) }
    // Six set logs, three "today" screens and one coach's athlete table in every ten requests.
    const mix = [put, today, put, put, today, put, athletes, put, today, put]

    const started = performance.now()
    samples.push({ s: 0, rssMb: server.rssMb() })
    const sampler = setInterval(() => samples.push({ s: (performance.now() - started) / 1000, rssMb: server.rssMb() }), 1000)
    ctx.log(`load: ${RATE} req/s for ${DURATION_S} s`)
    const result = await autocannon({ url: server.baseUrl, connections: 10, overallRate: RATE, duration: DURATION_S, requests: mix })
    clearInterval(sampler)
    samples.push({ s: (performance.now() - started) / 1000, rssMb: server.rssMb() })

    const afterWarmUp = samples.find((x) => x.s >= WARM_UP_S) ?? samples[0]!
    const peak = Math.max(...samples.map((x) => x.rssMb))
    const end = samples[samples.length - 1]!.rssMb
    const growth = Math.max(...samples.filter((x) => x.s >= afterWarmUp.s).map((x) => x.rssMb)) - afterWarmUp.rssMb
    const failures = result.errors + result.timeouts + result.non2xx
    const every10 = samples.filter((_, i) => i % 10 === 0 || i === samples.length - 1)
    const markdown = [
      `autocannon, 10 connections, fixed overall rate ${RATE} req/s for ${DURATION_S} s on loopback, mix per 10 requests: 6 set logs, 3 "today", 1 athlete table (150 athletes).`,
      '',
      `| requests | req/s | p50 ms | p99 ms | max ms | errors | timeouts | non-2xx |`,
      '|---:|---:|---:|---:|---:|---:|---:|---:|',
      `| ${result.requests.total} | ${result.requests.average.toFixed(0)} | ${result.latency.p50} | ${result.latency.p99} | ${result.latency.max} | ${result.errors} | ${result.timeouts} | ${result.non2xx} |`,
      '',
      `Server resident memory (VmRSS): ${samples[0]!.rssMb.toFixed(0)} MB at start, ${afterWarmUp.rssMb.toFixed(0)} MB after the ${WARM_UP_S} s warm-up, peak ${peak.toFixed(0)} MB, ${end.toFixed(0)} MB at the end; growth after warm-up ${growth.toFixed(1)} MB (bound ${GROWTH_BOUND_MB} MB).`,
      '',
      `Samples every 10 s: ${every10.map((x) => `${x.s.toFixed(0)} s ${x.rssMb.toFixed(0)} MB`).join(' · ')}`,
    ].join('\n')
    return {
      title: '4b. Load run (60 s at a fixed rate)',
      command: 'npm run bench -- --only load',
      markdown,
      figures: {
        rate: RATE, durationS: DURATION_S, requests: result.requests.total, requestsPerSecond: result.requests.average,
        p50Ms: result.latency.p50, p99Ms: result.latency.p99, maxMs: result.latency.max,
        errors: result.errors, timeouts: result.timeouts, non2xx: result.non2xx, rssSamples: samples, growthMb: growth,
      },
      budgets: [
        budget({ name: 'Load run: errors, timeouts and non-2xx', value: failures, limit: 0, unit: '', kind: 'max' }),
        budget({ name: 'Load run: memory growth after warm-up', value: growth, limit: GROWTH_BOUND_MB, unit: 'MB', kind: 'max' }),
      ],
    }
  } finally {
    await world.server.stop()
    await world.stopBare()
  }
}
