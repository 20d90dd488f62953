import { randomUUID } from 'node:crypto'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { openDatabase } from '../../server/db'
import { integrityCheck } from '../../server/db/backup'
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/db/seed/demo-accounts'
import type { RunSession, RunSet } from '../../shared/schemas/run.schema'
import { startBuiltServer } from '../helpers/server-process'

const SETS = 300
const IN_FLIGHT = 16
const KILL_AFTER_ACKS = 120

let server: Awaited<ReturnType<typeof startBuiltServer>> | undefined
afterAll(async () => {
  await server?.stop()
})

async function call(baseUrl: string, token: string, method: string, path: string, body?: unknown) {
  return fetch(baseUrl + '/api' + path, {
    method,
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  })
}

describe('a server killed mid-stream', () => {
  it('keeps every acknowledged set exactly once, takes the retries after a restart, and the database stays sound', async () => {
    server = await startBuiltServer()
    const signIn = await fetch(server.baseUrl + '/api/auth/sign-in', {
      method: 'POST', headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: DEMO_ACCOUNTS.lifterKg.email, password: DEMO_PASSWORD }),
    })
    const { token } = await signIn.json()
    const started = await call(server.baseUrl, token, 'POST', '/sessions?date=2026-12-01&tzOffset=0', {})
    const session: RunSession = (await started.json()).session
    const template: RunSet = session.sets.find((s) => s.kind === 'top')!

    // Sets made up on the phone, each with its own UUID, as the runner's "Add a set" does.
    const sets = Array.from({ length: SETS }, (_, i) => ({
      id: randomUUID(),
      body: {
        exerciseId: template.exerciseId, slotId: template.slotId, position: 5000 + i, kind: 'backoff', targetLoadKg: 50,
        targetRepsMin: 9, targetRepsMax: 12, targetReps: null, toFailure: false, targetRir: 1, loadKg: 50, reps: 10,
        rir: 1, failure: false, skipped: false, note: null, loggedAt: new Date().toISOString(), editedAt: new Date().toISOString(),
      },
    }))
    const acked = new Set<string>()
    let killed = false
    let next = 0
    const baseUrl = server.baseUrl

    // Several posts in flight, each retried (same UUID) on failure, until the server dies.
    async function worker() {
      while (next < sets.length && !killed) {
        const set = sets[next++]
        for (let attempt = 0; attempt < 3 && !killed; attempt++) {
          try {
            const res = await call(baseUrl, token, 'PUT', `/sessions/${session.id}/sets/${set.id}`, set.body)
            if (res.ok) {
              acked.add(set.id)
              break
            }
          } catch {
            // connection refused or reset: the process is gone
          }
        }
        if (acked.size >= KILL_AFTER_ACKS && !killed) {
          killed = true
          await server!.kill()
        }
      }
    }
    await Promise.all(Array.from({ length: IN_FLIGHT }, worker))
    expect(killed).toBe(true)
    expect(acked.size).toBeGreaterThanOrEqual(KILL_AFTER_ACKS)
    expect(acked.size).toBeLessThan(SETS)

    // Restart over the same database and send everything again (the phone's outbox retrying).
    const dir = server.dir
    server = await startBuiltServer({}, { dir })
    for (const set of sets) {
      const res = await call(server.baseUrl, token, 'PUT', `/sessions/${session.id}/sets/${set.id}`, set.body)
      expect(res.status).toBe(200)
    }
    const detail = await (await call(server.baseUrl, token, 'GET', `/sessions/${session.id}`)).json()
    const stored: string[] = detail.session.sets.map((s: { id: string }) => s.id)
    for (const id of acked) expect(stored.filter((s) => s === id)).toHaveLength(1)
    for (const set of sets) expect(stored.filter((s) => s === set.id)).toHaveLength(1)
    await server.stop({ keepData: true })

    const sequelize = await openDatabase(join(dir, 'e2e.sqlite'))
    expect(await integrityCheck(sequelize)).toBe('ok')
    await sequelize.close()
  })
})
