/**
 * The second baseline of the API benchmark: the least a set log can do on this stack. Express 5
 * with its JSON body parser, the bearer token checked with jsonwebtoken, the user read by id, and
 * the app's own one-statement upsert (server/db/set-log-upsert.ts) run through node-sqlite3 on
 * the same database file as the real server, each statement prepared once. Nothing else: no
 * Sequelize, no request log, no security headers, no compression, no zod check of the body.
 *
 * It answers what "set logging at 50 % of a bare route" asks of this machine: if this floor is
 * itself under 50 %, no tuning of the app's own layers can reach the budget.
 *
 * Started by api.ts as `node --import tsx tests/bench/floor-server.ts` with PORT, DATABASE_PATH
 * and JWT_SECRET_FILE (the real server's secret, so the same tokens verify); prints "ready".
 */
import { createSecretKey } from 'node:crypto'
import { readFileSync } from 'node:fs'
import express from 'express'
import jwt from 'jsonwebtoken'
import sqlite3 from 'sqlite3'
import { UPSERT_OWN_SET, upsertOwnSetParams } from '../../server/db/set-log-upsert'
import type { LogSetInput } from '../../shared/schemas/run.schema'

const db = new sqlite3.Database(process.env.DATABASE_PATH!)
const secret = createSecretKey(Buffer.from(readFileSync(process.env.JWT_SECRET_FILE!, 'utf8').trim()))

function exec(sql: string) {
  return new Promise<void>((resolve, reject) => db.exec(sql, (error) => (error ? reject(error) : resolve())))
}
// The same connection settings as server/db/index.ts.
await exec('PRAGMA journal_mode = WAL; PRAGMA synchronous = NORMAL; PRAGMA foreign_keys = ON; PRAGMA busy_timeout = 5000')

const userById = db.prepare('SELECT * FROM users WHERE id = $id')
const upsert = db.prepare(UPSERT_OWN_SET)

function readUser(id: number) {
  return new Promise<{ token_version: number; active: number } | undefined>((resolve, reject) =>
    userById.get({ $id: id }, (error: Error | null, row: { token_version: number; active: number } | undefined) => (error ? reject(error) : resolve(row))),
  )
}

function runUpsert(bind: Record<string, unknown>) {
  return new Promise<number>((resolve, reject) =>
    upsert.run(bind, function (this: sqlite3.RunResult, error: Error | null) {
      if (error) reject(error)
      else resolve(this.changes)
    }),
  )
}

const app = express()
app.use(express.json({ limit: '100kb' }))
app.put('/api/sessions/:id/sets/:setId', async (req, res) => {
  const match = /^Bearer\s+(\S+)$/i.exec(req.get('authorization') ?? '')
  let claims: jwt.JwtPayload
  try {
    claims = jwt.verify(match?.[1] ?? '', secret, { algorithms: ['HS256'] }) as jwt.JwtPayload
  } catch {
    res.status(401).json({ error: 'invalid_token' })
    return
  }
  const user = await readUser(Number(claims.sub))
  if (!user || user.token_version !== claims.ver || !user.active) {
    res.status(401).json({ error: 'invalid_token' })
    return
  }
  const input = req.body as LogSetInput
  const params = upsertOwnSetParams({ setId: req.params.setId, sessionId: Number(req.params.id), lifterId: Number(claims.sub) }, input)
  // node-sqlite3 names bound parameters with their prefix (as server/db/statement-pool.ts does).
  const bind = Object.fromEntries(Object.entries(params).map(([k, v]) => [`$${k}`, v]))
  // The real server falls back to its general path when nothing changed; the floor has none.
  if ((await runUpsert(bind)) !== 1) {
    res.status(409).json({ error: 'not_upserted' })
    return
  }
  res.json({ set: { id: req.params.setId, ...input }, updated: [] })
})

const server = app.listen(Number(process.env.PORT), '127.0.0.1', () => {
  process.stdout.write('ready\n')
})
// Its writes are checkpointed into the database file before it goes, so the real server, measured
// next on the same file, does not pay for folding them in (a checkpoint of the whole run).
process.on('SIGTERM', () =>
  server.close(() => {
    userById.finalize()
    upsert.finalize()
    db.exec('PRAGMA wal_checkpoint(TRUNCATE)', () => db.close(() => process.exit(0)))
  }),
)
