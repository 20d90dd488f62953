/**
 * A fixed request rate with evenly spaced arrivals: request i is due at start + i / rate, and is
 * sent then whether or not earlier answers have come back (an open model, as phones in a gym send
 * their sets independently). Each latency is counted from the moment the request was due, so a
 * stall in the server or in this process shows up in the figures instead of delaying the
 * requests that would have seen it (no coordinated omission).
 *
 * Why not autocannon's `overallRate`: autocannon 9 gives each connection its share of the rate
 * and lets it send that share back to back at the start of every second, then wait. At 200 req/s
 * over 10 connections the server gets bursts of 10 concurrent requests for the first part of each
 * second and nothing after, so its p99 is the queueing of a burst at full concurrency. Its
 * coordinated-omission correction also takes the expected interval as `Math.ceil(1 / rate)` ms,
 * which is 1 ms for any rate, so an answer of L ms is recorded about L times.
 */
import http from 'node:http'
import { percentileOfSorted } from './bench-types'

export interface PacedRequest {
  method: string
  path: string
  headers?: Record<string, string>
  body?: string
}

export interface PacedResult {
  name: string
  /** Requests due in the run (rate × duration). */
  due: number
  completed: number
  /** Answers that were not 2xx, and requests that failed or got no answer. */
  failures: number
  /** Completed requests over the time from the first due moment to the last answer. */
  requestsPerSecond: number
  p50Ms: number
  p90Ms: number
  p99Ms: number
  maxMs: number
  /** The largest delay between a request's due moment and its sending (this process's own lag). */
  maxSendLagMs: number
}

export async function pacedLoad(opts: {
  name: string
  url: string
  rate: number
  durationS: number
  next: () => PacedRequest
  /** Open keep-alive connections at most; requests beyond wait for one (and the wait is counted). */
  maxSockets?: number
}): Promise<PacedResult> {
  const base = new URL(opts.url)
  const agent = new http.Agent({ keepAlive: true, maxSockets: opts.maxSockets ?? 64 })
  const due = Math.round(opts.rate * opts.durationS)
  const intervalMs = 1000 / opts.rate
  const latencies: number[] = []
  let failures = 0
  let maxSendLagMs = 0
  let lastAnswerAt = 0
  const pending: Promise<void>[] = []

  const send = (dueAt: number) =>
    new Promise<void>((resolve) => {
      const r = opts.next()
      const req = http.request(
        { host: base.hostname, port: base.port, method: r.method, path: r.path, headers: r.headers, agent },
        (res) => {
          res.resume()
          res.on('end', () => {
            const now = performance.now()
            lastAnswerAt = Math.max(lastAnswerAt, now)
            if (res.statusCode !== undefined && res.statusCode >= 200 && res.statusCode < 300) latencies.push(now - dueAt)
            else failures++
            resolve()
          })
        },
      )
      req.setTimeout(10_000, () => req.destroy(new Error('timeout')))
      req.on('error', () => {
        failures++
        resolve()
      })
      req.end(r.body)
    })

  const start = performance.now() + 20
  let sent = 0
  await new Promise<void>((resolve) => {
    const tick = () => {
      const now = performance.now()
      while (sent < due && start + sent * intervalMs <= now) {
        const dueAt = start + sent * intervalMs
        maxSendLagMs = Math.max(maxSendLagMs, now - dueAt)
        pending.push(send(dueAt))
        sent++
      }
      if (sent >= due) return resolve()
      // Wake up at the next due moment (timers fire at 1 ms granularity at best).
      setTimeout(tick, Math.max(0, start + sent * intervalMs - performance.now()))
    }
    setTimeout(tick, Math.max(0, start - performance.now()))
  })
  await Promise.all(pending)
  agent.destroy()

  const sorted = latencies.sort((a, b) => a - b)
  return {
    name: opts.name,
    due,
    completed: latencies.length,
    failures,
    requestsPerSecond: latencies.length / ((lastAnswerAt - start) / 1000),
    p50Ms: percentileOfSorted(sorted, 50),
    p90Ms: percentileOfSorted(sorted, 90),
    p99Ms: percentileOfSorted(sorted, 99),
    maxMs: sorted[sorted.length - 1] ?? Number.NaN,
    maxSendLagMs,
  }
}

/**
 * `pacedLoad` in a worker thread, with the requests made beforehand: the worker has its own heap
 * and event loop, so a garbage collection in the benchmark's main process (which by then has
 * run Lighthouse and Playwright) cannot delay the sending. A 300 ms stall of that kind once made
 * a paced run's p99 nearly 500 ms.
 */
export async function pacedLoadInWorker(opts: { name: string; url: string; rate: number; durationS: number; requests: PacedRequest[]; maxSockets?: number }): Promise<PacedResult> {
  const { Worker } = await import('node:worker_threads')
  // The worker runs this file: TypeScript, so it registers tsx's loader first (as `tsx` does here).
  const source = `import('tsx/esm/api').then((tsx) => { tsx.register(); return import(${JSON.stringify(import.meta.url)}) })`
  const worker = new Worker(source, { eval: true, workerData: opts })
  try {
    return await new Promise<PacedResult>((resolve, reject) => {
      worker.once('message', resolve)
      worker.once('error', reject)
      worker.once('exit', (code) => reject(new Error(`paced-load worker exited with ${code}`)))
    })
  } finally {
    await worker.terminate()
  }
}

const { isMainThread, parentPort, workerData } = await import('node:worker_threads')
if (!isMainThread && parentPort && (workerData as { requests?: unknown } | null)?.requests) {
  const { requests, ...rest } = workerData as Parameters<typeof pacedLoadInWorker>[0]
  let turn = 0
  parentPort.postMessage(await pacedLoad({ ...rest, next: () => requests[turn++ % requests.length]! }))
}
