import { DataTypes, type QueryInterface } from 'sequelize'

/** Columns the set-by-set runner needs on each set and next step. */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('set_logs', 'skipped', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false })
  // The client's edit time: when two devices disagree, the later edit wins.
  await qi.addColumn('set_logs', 'edited_at', { type: DataTypes.DATE, allowNull: true })
  await qi.addColumn('set_logs', 'target_reps', { type: DataTypes.INTEGER, allowNull: true })
  // The slot role the set was planned under (also for exercises added to a session by hand).
  await qi.addColumn('set_logs', 'role', { type: DataTypes.STRING(20), allowNull: true })
  await qi.addColumn('next_steps', 'target_reps', { type: DataTypes.INTEGER, allowNull: true })
  // The rotation position a session was started at: finishing it moves the rotation on.
  await qi.addColumn('sessions', 'rotation_index', { type: DataTypes.INTEGER, allowNull: true })
  await qi.addIndex('next_steps', ['athlete_id', 'slot_id', 'created_at'])
  await qi.addIndex('sessions', ['athlete_id', 'status'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('sessions', ['athlete_id', 'status'])
  await qi.removeIndex('next_steps', ['athlete_id', 'slot_id', 'created_at'])
  await qi.removeColumn('next_steps', 'target_reps')
  await qi.removeColumn('sessions', 'rotation_index')
  for (const column of ['role', 'target_reps', 'edited_at', 'skipped']) await qi.removeColumn('set_logs', column)
}
