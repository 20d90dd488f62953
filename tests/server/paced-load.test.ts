import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { afterEach, describe, expect, it } from 'vitest'
import { percentileOfSorted } from '../bench/bench-types'
import { pacedLoad, pacedLoadInWorker } from '../bench/paced-load'

let server: Server | undefined
afterEach(async () => {
  server?.closeAllConnections()
  await new Promise((r) => (server ? server.close(r) : r(undefined)))
  server = undefined
})

async function listen(handler: Parameters<typeof createServer>[1]) {
  server = createServer(handler).listen(0, '127.0.0.1')
  await new Promise((r) => server!.once('listening', r))
  return `http://127.0.0.1:${(server.address() as AddressInfo).port}`
}

describe('bench/paced-load', () => {
  it('takes percentiles by nearest rank', () => {
    // The nearest-rank method: the smallest value with at least p % of the values at or below it.
    // Example list and answers as in Wikipedia's "Percentile" article (nearest-rank examples; from memory).
    const list = [15, 20, 35, 40, 50]
    expect(percentileOfSorted(list, 5)).toBe(15)
    expect(percentileOfSorted(list, 30)).toBe(20)
    expect(percentileOfSorted(list, 40)).toBe(20)
    expect(percentileOfSorted(list, 50)).toBe(35)
    expect(percentileOfSorted(list, 100)).toBe(50)
  })

  it('sends at the asked rate, evenly, and counts every answer', async () => {
    const arrivals: number[] = []
    const url = await listen((req, res) => {
      arrivals.push(performance.now())
      req.resume()
      req.on('end', () => res.end('{}'))
    })
    const result = await pacedLoad({ name: 'even', url, rate: 100, durationS: 1, next: () => ({ method: 'PUT', path: '/x', body: '{"a":1}' }) })
    expect(result).toMatchObject({ due: 100, completed: 100, failures: 0 })
    expect(result.requestsPerSecond).toBeGreaterThan(85)
    expect(result.requestsPerSecond).toBeLessThan(115)
    // No burst: never more than a few arrivals within one 10 ms interval.
    const gaps = arrivals.slice(1).map((t, i) => t - arrivals[i]!)
    expect(gaps.filter((g) => g < 2).length).toBeLessThan(20)
  })

  it('counts a stall from the moment each request was due (no coordinated omission)', async () => {
    let seen = 0
    const url = await listen((req, res) => {
      // The 20th request blocks this process for 200 ms: requests due meanwhile go out late,
      // and their wait must show in the figures (about 20 requests at 100 req/s).
      if (++seen === 20) {
        const until = performance.now() + 200
        while (performance.now() < until);
      }
      req.resume()
      req.on('end', () => res.end('{}'))
    })
    const result = await pacedLoad({ name: 'stall', url, rate: 100, durationS: 1, next: () => ({ method: 'GET', path: '/x' }) })
    expect(result.completed).toBe(100)
    expect(result.maxMs).toBeGreaterThan(150)
    expect(result.p90Ms).toBeGreaterThan(80)
    expect(result.maxSendLagMs).toBeGreaterThan(150)
  })

  it('counts non-2xx answers and refused connections as failures', async () => {
    const url = await listen((_req, res) => {
      res.statusCode = 503
      res.end()
    })
    const result = await pacedLoad({ name: 'failing', url, rate: 50, durationS: 0.2, next: () => ({ method: 'GET', path: '/x' }) })
    expect(result).toMatchObject({ due: 10, completed: 0, failures: 10 })
  })
  it('runs the same in a worker thread, from requests made beforehand, unhurt by a stall of this thread', async () => {
    const paths: string[] = []
    const url = await listen((req, res) => {
      paths.push(req.url!)
      req.resume()
      req.on('end', () => res.end('{}'))
    })
    const requests = Array.from({ length: 50 }, (_, i) => ({ method: 'GET', path: `/n/${i}` }))
    const running = pacedLoadInWorker({ name: 'worker', url, rate: 50, durationS: 1, requests })
    // This thread (where the server above also runs) stalls for 100 ms once the run is going.
    await expect.poll(() => paths.length, { timeout: 10_000, interval: 5 }).toBeGreaterThanOrEqual(10)
    const until = performance.now() + 100
    while (performance.now() < until);
    const result = await running
    expect(result).toMatchObject({ due: 50, completed: 50, failures: 0 })
    expect(paths).toEqual(requests.map((r) => r.path))
    // The worker kept sending on time; the answers held up by the stalled server show it.
    expect(result.maxSendLagMs).toBeLessThan(50)
    expect(result.maxMs).toBeGreaterThan(60)
  }, 20_000)
})
