import { DataTypes, type QueryInterface } from 'sequelize'

/**
 * What the progression engine needs beyond the first schema:
 * - exercises: how the logged load relates to the load moved (`load_mode`: as logged, added to the
 *   body mass, or assistance taken from it); `load_step_kg` 0 now means "the smallest step the
 *   lifter's equipment makes", and the shared library's generic steps become 0 so a pound gym is
 *   not held to a kilogram step (the column stays NOT NULL: changing a column rebuilds the table
 *   in SQLite, which foreign keys make unsafe);
 * - set_logs: `deload` marks sets planned as a deload, which progress and plateau checks leave out;
 * - next_steps: which option was taken (the next step, its alternative, an edit, or a plateau option);
 * - slot_adjustments: a lifter's own changes to a plan slot (a fresh exercise after a rotation,
 *   sets added on a plateau), so a plan shared by several athletes stays as the coach wrote it;
 * - start_estimates: an estimated 1RM to plan a lift's first session from (the coach's, or a recent
 *   set the lifter entered on the set card).
 */
/** Library exercises added with this change: two assisted machines and a third chest fly (rotation needs a fresh one). */
const LIBRARY_ADDITIONS: Array<[name: string, pattern: string, primary: string[], secondary: string[], equipment: string, loadMode: string, restSec: number]> = [
  ['Assisted pull-up machine', 'vertical_pull', ['lats'], ['biceps', 'upper_back'], 'machine', 'assisted', 120],
  ['Assisted dip machine', 'horizontal_push', ['chest', 'triceps'], ['front_delts'], 'machine', 'assisted', 120],
  ['Dumbbell chest fly', 'chest_fly', ['chest'], ['front_delts'], 'dumbbell', 'external', 90],
]

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('exercises', 'load_mode', { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'external' })
  await qi.bulkUpdate('exercises', { load_step_kg: 0 }, { owner_id: null })
  await qi.bulkUpdate('exercises', { load_mode: 'bodyweight' }, { equipment_kind: 'bodyweight' })

  // New exercises join the shared library of a database that has one; an empty database gets the
  // whole library from the seed.
  const now = new Date()
  const [library] = await qi.sequelize.query('SELECT COUNT(*) AS n FROM exercises WHERE owner_id IS NULL')
  const hasLibrary = Number((library as Array<{ n: number }>)[0].n) > 0
  for (const [name, pattern, primary, secondary, equipment, loadMode, restSec] of hasLibrary ? LIBRARY_ADDITIONS : []) {
    const [rows] = await qi.sequelize.query('SELECT id FROM exercises WHERE owner_id IS NULL AND name = ?', { replacements: [name] })
    if ((rows as unknown[]).length > 0) continue
    await qi.bulkInsert('exercises', [{
      owner_id: null, name, pattern, primary_muscles: JSON.stringify(primary), secondary_muscles: JSON.stringify(secondary),
      equipment_kind: equipment, load_mode: loadMode, load_step_kg: 0, default_rest_sec: restSec, created_at: now, updated_at: now,
    }])
  }

  await qi.addColumn('set_logs', 'deload', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false })
  await qi.addColumn('next_steps', 'option', { type: DataTypes.STRING(16), allowNull: true })

  await qi.createTable('slot_adjustments', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    athlete_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    slot_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'slots', key: 'id' }, onDelete: 'CASCADE' },
    exercise_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'exercises', key: 'id' }, onDelete: 'SET NULL' },
    extra_sets: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    changed_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('slot_adjustments', ['athlete_id', 'slot_id'], { unique: true })
  await qi.addIndex('slot_adjustments', ['slot_id'])

  await qi.createTable('start_estimates', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    athlete_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    exercise_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'exercises', key: 'id' }, onDelete: 'CASCADE' },
    e1rm_kg: { type: DataTypes.DOUBLE, allowNull: false },
    /** The set it came from, when the lifter entered a recent set. */
    load_kg: { type: DataTypes.DOUBLE, allowNull: true },
    reps: { type: DataTypes.INTEGER, allowNull: true },
    source: { type: DataTypes.STRING(12), allowNull: false },
    set_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('start_estimates', ['athlete_id', 'exercise_id'], { unique: true })
  await qi.addIndex('start_estimates', ['exercise_id'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('start_estimates')
  await qi.dropTable('slot_adjustments')
  await qi.removeColumn('next_steps', 'option')
  await qi.removeColumn('set_logs', 'deload')
  await qi.bulkUpdate('exercises', { load_step_kg: 2.5 }, { load_step_kg: 0 })
  await qi.removeColumn('exercises', 'load_mode')
}
