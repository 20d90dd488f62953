import type { QueryInterface } from 'sequelize'

/**
 * Indexes for the hot queries, found with EXPLAIN QUERY PLAN on the large demo club
 * (`npm run seed:large`); the plans and timings are in the benchmark report
 * (`npm run bench -- --only sql`).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  // A lifter's completed sessions, newest first: today's last session, the engine's history,
  // the athlete table (last session, recent weeks, waiting for review), the review desk, the
  // review flags' previous session. It starts with (athlete_id, status), so it replaces that one.
  // (An index on (status, completed_at) made a big coach's review desk faster but a small
  // coach's one slower, walking everybody's sessions: left out.)
  await qi.addIndex('sessions', ['athlete_id', 'status', 'completed_at'])
  await qi.removeIndex('sessions', ['athlete_id', 'status'])
  // The lifter's gym, read by every request that plans sets (was a scan of the table).
  await qi.addIndex('equipment_profiles', ['user_id', 'is_default'])
  // A finished session's next steps: the finish screen and the report (was a scan).
  await qi.addIndex('next_steps', ['session_id'])
  // A set's form-check video in the session detail (was a scan).
  await qi.addIndex('uploads', ['set_log_id'])
  // Foreign keys that point at sets, slots and plan days: deleting one looks for the rows that
  // refer to it. Removing an exercise from a plan day scanned every set of every lifter
  // (about 1.3 s on the large club, holding the write lock); swapping an exercise in a
  // running session scanned the comments for each open set it deletes.
  await qi.addIndex('set_logs', ['slot_id'])
  await qi.addIndex('next_steps', ['slot_id'])
  await qi.addIndex('sessions', ['plan_day_id'])
  await qi.addIndex('comments', ['set_log_id'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('comments', ['set_log_id'])
  await qi.removeIndex('sessions', ['plan_day_id'])
  await qi.removeIndex('next_steps', ['slot_id'])
  await qi.removeIndex('set_logs', ['slot_id'])
  await qi.removeIndex('uploads', ['set_log_id'])
  await qi.removeIndex('next_steps', ['session_id'])
  await qi.removeIndex('equipment_profiles', ['user_id', 'is_default'])
  await qi.addIndex('sessions', ['athlete_id', 'status'])
  await qi.removeIndex('sessions', ['athlete_id', 'status', 'completed_at'])
}
