import { DataTypes, type QueryInterface } from 'sequelize'

/** Single-use password reset tokens (only their SHA-256 is stored). */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('password_resets', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('invites', ['coach_id', 'accepted_at'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('invites', ['coach_id', 'accepted_at'])
  await qi.dropTable('password_resets')
}
