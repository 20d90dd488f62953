import { DataTypes, type QueryInterface } from 'sequelize'

/** The coach's e-mail setting for completed sessions, and when their last daily digest went out. */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('users', 'notify_completed', { type: DataTypes.STRING(5), allowNull: false, defaultValue: 'each' })
  await qi.addColumn('users', 'last_digest_at', { type: DataTypes.DATE, allowNull: true })
  await qi.addIndex('reviews', ['coach_id'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('reviews', ['coach_id'])
  await qi.removeColumn('users', 'last_digest_at')
  await qi.removeColumn('users', 'notify_completed')
}
