import { createServer, request as httpRequest } from 'node:http'
import type { AddressInfo } from 'node:net'
import { Writable } from 'node:stream'
import express from 'express'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { createLogger } from '../../server/logger'
import { loggedUrl, requestLog } from '../../server/middleware/request-log'

/** An app with only the request log in front of a few routes, logging into `lines`. */
function loggedApp() {
  const lines: Array<Record<string, unknown>> = []
  const sink = new Writable({ write: (chunk, _enc, done) => (lines.push(JSON.parse(String(chunk))), done()) })
  const app = express()
  app.use(requestLog(createLogger({ logLevel: 'info' }, sink)))
  app.get('/ok', (_req, res) => res.json({ ok: true }))
  app.get('/broken', (_req, res) => res.status(503).json({}))
  app.get('/slow', () => {
    // Never answers: the client gives up first.
  })
  return { app, lines }
}

describe('request log', () => {
  it('writes one line per request with method, path, status and time, at info for an answer below 500', async () => {
    const { app, lines } = loggedApp()
    await request(app).get('/ok?x=1').set('Authorization', 'Bearer secret-token').set('Cookie', 'a=b')
    expect(lines).toHaveLength(1)
    const [line] = lines
    expect(line).toMatchObject({ level: 30, msg: 'request completed', req: { method: 'GET', url: '/ok?x=1' }, res: { statusCode: 200 } })
    expect(Object.keys(line!.req as object)).toEqual(['method', 'url'])
    expect(typeof line!.responseTime).toBe('number')
    expect(JSON.stringify(line)).not.toMatch(/secret-token|a=b/)
  })

  it('logs a 5xx answer at error level', async () => {
    const { app, lines } = loggedApp()
    await request(app).get('/broken')
    expect(lines).toMatchObject([{ level: 50, msg: 'request errored', res: { statusCode: 503 } }])
  })

  it('logs a request whose client went away before the answer, once', async () => {
    const { app, lines } = loggedApp()
    const server = createServer(app).listen(0, '127.0.0.1')
    await new Promise((r) => server.once('listening', r))
    const { port } = server.address() as AddressInfo
    await new Promise<void>((resolve) => {
      const req = httpRequest({ host: '127.0.0.1', port, path: '/slow' })
      req.on('error', () => resolve())
      req.end()
      setTimeout(() => req.destroy(), 100)
    })
    await expect.poll(() => lines.length).toBe(1)
    expect(lines[0]).toMatchObject({ level: 40, msg: 'request aborted', req: { url: '/slow' } })
    server.closeAllConnections()
    await new Promise((r) => server.close(r))
  })

  it('never writes a signed link signature', () => {
    expect(loggedUrl('/api/uploads/7/video?exp=1&sig=abcdef&x=1')).toBe('/api/uploads/7/video?exp=1&sig=[redacted]&x=1')
  })
})
