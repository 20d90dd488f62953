import { cpSync, existsSync, mkdirSync, rmSync, copyFileSync } from 'node:fs'
import { basename, join } from 'node:path'
import type { Sequelize } from 'sequelize'

/**
 * A consistent copy of the live database and the uploads folder. SQLite's VACUUM INTO writes a
 * transactionally consistent copy while the app keeps running (SQLite docs, "VACUUM INTO").
 * SQLite-only SQL is allowed here: this is database tooling, like the PRAGMAs in index.ts.
 */
export async function backup(sequelize: Sequelize, uploadsDir: string, backupsRoot: string, now = new Date()) {
  const stamp = now.toISOString().replace(/[:.]/g, '-')
  const dir = join(backupsRoot, `chalkline-${stamp}`)
  mkdirSync(dir, { recursive: true })
  const file = join(dir, 'chalkline.sqlite')
  await sequelize.query('VACUUM INTO :file', { replacements: { file } })
  if (existsSync(uploadsDir)) cpSync(uploadsDir, join(dir, 'uploads'), { recursive: true, filter: (src) => basename(src) !== 'tmp' })
  return dir
}

/** Checks a database file with SQLite's own integrity check; returns its answer ("ok" when sound). */
export async function integrityCheck(sequelize: Sequelize): Promise<string> {
  const [rows] = await sequelize.query('PRAGMA integrity_check')
  return (rows as Array<{ integrity_check: string }>).map((r) => r.integrity_check).join('; ')
}

/**
 * Puts a backup back: the database file (its WAL and shared-memory files removed first) and the
 * uploads folder. The server must be stopped while this runs.
 */
export function restore(backupDir: string, databasePath: string, uploadsDir: string) {
  const file = join(backupDir, 'chalkline.sqlite')
  if (!existsSync(file)) throw new Error(`No chalkline.sqlite in ${backupDir}`)
  for (const suffix of ['-wal', '-shm']) rmSync(databasePath + suffix, { force: true })
  copyFileSync(file, databasePath)
  rmSync(uploadsDir, { recursive: true, force: true })
  if (existsSync(join(backupDir, 'uploads'))) cpSync(join(backupDir, 'uploads'), uploadsDir, { recursive: true })
}
