import type { Sequelize } from 'sequelize'
import type { LogSetInput } from '@shared/schemas/run.schema'
import { writeWithOthers } from './sqlite-concurrency'
import { prepared } from './statement-pool'

/**
 * The common set log as one statement on the main connection: a set of an exercise already in
 * the lifter's own session is inserted, or updated when this edit is not older than the stored
 * one and the set belongs to that session. The general path (a transaction of seven statements,
 * each transaction on a connection of its own) managed about 1 % of a bare Express route; this
 * one is what the runner sends for nearly every tap.
 *
 * Returns false when the statement changed nothing (not the lifter's session, an exercise new to
 * the session, a set of another session, an older edit): the caller then takes the general path,
 * which tells those cases apart. `ON CONFLICT … DO UPDATE … WHERE` is SQLite's upsert (3.24+);
 * the `WHERE` on the SELECT keeps its parser from reading ON CONFLICT as a join constraint.
 * The unary `+` on exercise_id keeps SQLite's planner (no ANALYZE statistics) off the
 * exercise index, which would walk every set ever logged of that exercise, and onto the
 * session's index, a few dozen rows ("The SQLite Query Optimizer Overview", section on
 * disqualifying WHERE terms with unary +); tests/server/set-log-upsert.test.ts checks the plan.
 */
export const UPSERT_OWN_SET = `
INSERT INTO set_logs (
  id, session_id, exercise_id, slot_id, position, kind, target_load_kg, target_reps_min, target_reps_max,
  target_reps, to_failure, target_rir, load_kg, reps, rir, failure, skipped, note, logged_at, edited_at,
  role, created_at, updated_at)
SELECT
  $id, s.id, $exerciseId, $slotId, $position, $kind, $targetLoadKg, $targetRepsMin, $targetRepsMax,
  $targetReps, $toFailure, $targetRir, $loadKg, $reps, $rir, $failure, $skipped, $note, $loggedAt, $editedAt,
  NULL, $now, $now
FROM sessions s
WHERE s.id = $sessionId AND s.athlete_id = $lifterId
  AND EXISTS (SELECT 1 FROM set_logs x WHERE x.session_id = s.id AND +x.exercise_id = $exerciseId)
ON CONFLICT (id) DO UPDATE SET
  exercise_id = excluded.exercise_id, slot_id = excluded.slot_id, position = excluded.position,
  kind = excluded.kind, target_load_kg = excluded.target_load_kg, target_reps_min = excluded.target_reps_min,
  target_reps_max = excluded.target_reps_max, target_reps = excluded.target_reps,
  to_failure = excluded.to_failure, target_rir = excluded.target_rir, load_kg = excluded.load_kg,
  reps = excluded.reps, rir = excluded.rir, failure = excluded.failure, skipped = excluded.skipped,
  note = excluded.note, logged_at = excluded.logged_at, edited_at = excluded.edited_at,
  updated_at = excluded.updated_at
WHERE set_logs.session_id = excluded.session_id
  AND (set_logs.edited_at IS NULL OR set_logs.edited_at <= excluded.edited_at)`

/**
 * A date in the text form Sequelize stores for DATE columns on SQLite with its default time zone
 * ('2026-12-02 03:59:56.123 +00:00'). Bound parameters skip Sequelize's formatting (node-sqlite3
 * would store a Date as a number), and edited_at is compared as text, so the form must match.
 */
export function asStoredDate(date: Date) {
  return date.toISOString().replace('T', ' ').replace('Z', ' +00:00')
}

export interface OwnSetKey {
  lifterId: number
  sessionId: number
  setId: string
}

/** UPSERT_OWN_SET's parameters (names without the `$`) for one set log, dates in stored form. */
export function upsertOwnSetParams(key: OwnSetKey, input: LogSetInput, now = new Date()) {
  return {
    id: key.setId, sessionId: key.sessionId, lifterId: key.lifterId,
    exerciseId: input.exerciseId, slotId: input.slotId, position: input.position, kind: input.kind,
    targetLoadKg: input.targetLoadKg, targetRepsMin: input.targetRepsMin, targetRepsMax: input.targetRepsMax,
    targetReps: input.targetReps, toFailure: input.toFailure, targetRir: input.targetRir, loadKg: input.loadKg,
    reps: input.reps, rir: input.rir, failure: input.failure, skipped: input.skipped, note: input.note,
    loggedAt: input.loggedAt ? asStoredDate(new Date(input.loggedAt)) : null,
    editedAt: asStoredDate(new Date(input.editedAt)),
    now: asStoredDate(now),
  }
}

export async function upsertOwnSetLog(sequelize: Sequelize, key: OwnSetKey, input: LogSetInput): Promise<boolean> {
  const bind = upsertOwnSetParams(key, input)
  const changes = await writeWithOthers(sequelize, () => prepared(sequelize, UPSERT_OWN_SET).run(bind))
  return changes === 1
}
