import { DataTypes, type QueryInterface } from 'sequelize'

const { INTEGER, STRING, BOOLEAN, DATE, DATEONLY, DOUBLE, TEXT, JSON: JSONTYPE } = DataTypes

const id = { type: INTEGER, primaryKey: true, autoIncrement: true, allowNull: false }
const timestamps = {
  created_at: { type: DATE, allowNull: false },
  updated_at: { type: DATE, allowNull: false },
}
const ref = (table: string, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT', allowNull = false) => ({
  type: INTEGER,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
  onUpdate: 'CASCADE',
})

/** The whole first schema: every entity of the product brief's data sketch. */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('clubs', { id, name: { type: STRING(120), allowNull: false }, ...timestamps })

  await qi.createTable('users', {
    id,
    club_id: ref('clubs', 'SET NULL', true),
    name: { type: STRING(80), allowNull: false },
    email: { type: STRING(254), allowNull: false, unique: true },
    password_hash: { type: STRING(100), allowNull: false },
    role: { type: STRING(10), allowNull: false },
    unit: { type: STRING(2), allowNull: false, defaultValue: 'kg' },
    active: { type: BOOLEAN, allowNull: false, defaultValue: true },
    // Bumped on password change or "sign out everywhere": older tokens stop working.
    token_version: { type: INTEGER, allowNull: false, defaultValue: 0 },
    cautions_acknowledged_at: { type: DATE, allowNull: true },
    ...timestamps,
  })

  await qi.createTable('coach_athletes', {
    id,
    coach_id: ref('users', 'CASCADE'),
    athlete_id: ref('users', 'CASCADE'),
    ...timestamps,
  })
  await qi.addIndex('coach_athletes', ['coach_id', 'athlete_id'], { unique: true })
  await qi.addIndex('coach_athletes', ['athlete_id'])

  await qi.createTable('invites', {
    id,
    coach_id: ref('users', 'CASCADE'),
    email: { type: STRING(254), allowNull: false },
    name: { type: STRING(80), allowNull: false },
    token_hash: { type: STRING(64), allowNull: false, unique: true },
    expires_at: { type: DATE, allowNull: false },
    accepted_at: { type: DATE, allowNull: true },
    ...timestamps,
  })

  await qi.createTable('exercises', {
    id,
    owner_id: ref('users', 'CASCADE', true), // null: the shared library
    name: { type: STRING(80), allowNull: false },
    pattern: { type: STRING(30), allowNull: false },
    primary_muscles: { type: JSONTYPE, allowNull: false },
    secondary_muscles: { type: JSONTYPE, allowNull: false },
    equipment_kind: { type: STRING(20), allowNull: false },
    load_step_kg: { type: DOUBLE, allowNull: false },
    default_rest_sec: { type: INTEGER, allowNull: false },
    ...timestamps,
  })

  await qi.createTable('equipment_profiles', {
    id,
    user_id: ref('users', 'CASCADE'),
    name: { type: STRING(80), allowNull: false },
    spec: { type: JSONTYPE, allowNull: false },
    is_default: { type: BOOLEAN, allowNull: false, defaultValue: false },
    ...timestamps,
  })

  await qi.createTable('plans', {
    id,
    owner_id: ref('users', 'CASCADE'),
    name: { type: STRING(80), allowNull: false },
    split_kind: { type: STRING(30), allowNull: false },
    archived_at: { type: DATE, allowNull: true },
    ...timestamps,
  })
  await qi.createTable('plan_days', {
    id,
    plan_id: ref('plans', 'CASCADE'),
    position: { type: INTEGER, allowNull: false },
    name: { type: STRING(60), allowNull: false },
    is_rest: { type: BOOLEAN, allowNull: false, defaultValue: false },
    ...timestamps,
  })
  await qi.addIndex('plan_days', ['plan_id', 'position'])
  await qi.createTable('day_versions', {
    id,
    plan_day_id: ref('plan_days', 'CASCADE'),
    label: { type: STRING(2), allowNull: false },
    ...timestamps,
  })
  await qi.addIndex('day_versions', ['plan_day_id', 'label'], { unique: true })
  await qi.createTable('slots', {
    id,
    day_version_id: ref('day_versions', 'CASCADE'),
    position: { type: INTEGER, allowNull: false },
    exercise_id: ref('exercises', 'RESTRICT'),
    role: { type: STRING(20), allowNull: false },
    scheme: { type: JSONTYPE, allowNull: false },
    rest_sec: { type: INTEGER, allowNull: false },
    ...timestamps,
  })
  await qi.addIndex('slots', ['day_version_id', 'position'])

  await qi.createTable('assignments', {
    id,
    athlete_id: ref('users', 'CASCADE'),
    plan_id: ref('plans', 'CASCADE'),
    start_date: { type: DATEONLY, allowNull: false },
    // Position in the rotation of (day, version) pairs: day = i mod days, version = floor(i / days) mod 2.
    rotation_index: { type: INTEGER, allowNull: false, defaultValue: 0 },
    active: { type: BOOLEAN, allowNull: false, defaultValue: true },
    ...timestamps,
  })
  await qi.addIndex('assignments', ['athlete_id', 'active'])

  await qi.createTable('sessions', {
    id,
    athlete_id: ref('users', 'CASCADE'),
    assignment_id: ref('assignments', 'SET NULL', true),
    plan_day_id: ref('plan_days', 'SET NULL', true),
    day_name: { type: STRING(60), allowNull: true }, // kept so plan edits never rewrite history
    version_label: { type: STRING(2), allowNull: true },
    status: { type: STRING(12), allowNull: false },
    started_at: { type: DATE, allowNull: true },
    completed_at: { type: DATE, allowNull: true },
    summary: { type: JSONTYPE, allowNull: true },
    note: { type: TEXT, allowNull: true },
    ...timestamps,
  })
  await qi.addIndex('sessions', ['athlete_id', 'completed_at'])

  await qi.createTable('set_logs', {
    id: { type: STRING(36), primaryKey: true, allowNull: false }, // client-made UUID: retries are safe
    session_id: ref('sessions', 'CASCADE'),
    exercise_id: ref('exercises', 'RESTRICT'),
    slot_id: ref('slots', 'SET NULL', true),
    position: { type: INTEGER, allowNull: false },
    kind: { type: STRING(10), allowNull: false },
    target_load_kg: { type: DOUBLE, allowNull: true },
    target_reps_min: { type: INTEGER, allowNull: true },
    target_reps_max: { type: INTEGER, allowNull: true },
    to_failure: { type: BOOLEAN, allowNull: false, defaultValue: false },
    target_rir: { type: INTEGER, allowNull: true },
    load_kg: { type: DOUBLE, allowNull: true },
    reps: { type: INTEGER, allowNull: true },
    rir: { type: INTEGER, allowNull: true },
    failure: { type: BOOLEAN, allowNull: false, defaultValue: false },
    note: { type: TEXT, allowNull: true },
    logged_at: { type: DATE, allowNull: true },
    ...timestamps,
  })
  await qi.addIndex('set_logs', ['session_id', 'position'])
  await qi.addIndex('set_logs', ['exercise_id'])

  await qi.createTable('next_steps', {
    id,
    athlete_id: ref('users', 'CASCADE'),
    exercise_id: ref('exercises', 'RESTRICT'),
    slot_id: ref('slots', 'SET NULL', true),
    session_id: ref('sessions', 'CASCADE', true),
    status: { type: STRING(10), allowNull: false },
    target_load_kg: { type: DOUBLE, allowNull: true },
    target_reps_min: { type: INTEGER, allowNull: true },
    target_reps_max: { type: INTEGER, allowNull: true },
    reason: { type: JSONTYPE, allowNull: true },
    ...timestamps,
  })
  await qi.addIndex('next_steps', ['athlete_id', 'exercise_id'])

  await qi.createTable('reviews', {
    id,
    session_id: { ...ref('sessions', 'CASCADE'), unique: true },
    coach_id: ref('users', 'CASCADE'),
    reviewed_at: { type: DATE, allowNull: false },
    ...timestamps,
  })
  await qi.createTable('comments', {
    id,
    session_id: ref('sessions', 'CASCADE'),
    set_log_id: { type: STRING(36), allowNull: true, references: { model: 'set_logs', key: 'id' }, onDelete: 'SET NULL' },
    author_id: ref('users', 'CASCADE'),
    body: { type: TEXT, allowNull: false },
    ...timestamps,
  })
  await qi.addIndex('comments', ['session_id'])
  await qi.createTable('uploads', {
    id,
    set_log_id: { type: STRING(36), allowNull: false, references: { model: 'set_logs', key: 'id' }, onDelete: 'CASCADE' },
    owner_id: ref('users', 'CASCADE'),
    storage_key: { type: STRING(80), allowNull: false },
    mime_type: { type: STRING(60), allowNull: false },
    size_bytes: { type: INTEGER, allowNull: false },
    ...timestamps,
  })
  await qi.createTable('body_weights', {
    id,
    user_id: ref('users', 'CASCADE'),
    measured_on: { type: DATEONLY, allowNull: false },
    weight_kg: { type: DOUBLE, allowNull: false },
    ...timestamps,
  })
  await qi.addIndex('body_weights', ['user_id', 'measured_on'], { unique: true })
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const table of [
    'body_weights', 'uploads', 'comments', 'reviews', 'next_steps', 'set_logs', 'sessions',
    'assignments', 'slots', 'day_versions', 'plan_days', 'plans', 'equipment_profiles',
    'exercises', 'invites', 'coach_athletes', 'users', 'clubs',
  ]) {
    await qi.dropTable(table)
  }
}
