import { fn, col } from 'sequelize'
import type { AdminUpdateUserInput, AdminUserRow } from '@shared/schemas/admin.schema'
import { SessionModel, UserModel } from '../db'
import { AppError } from '../errors'

function toRow(user: UserModel, lastSessionAt: string | Date | null | undefined): AdminUserRow {
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    role: user.role,
    active: user.active,
    lastSessionAt: lastSessionAt ? new Date(lastSessionAt).toISOString() : null,
    createdAt: user.createdAt.toISOString(),
  }
}

export async function listUsers(): Promise<AdminUserRow[]> {
  const [users, lastSessions] = await Promise.all([
    UserModel.findAll({ order: [['role', 'ASC'], ['name', 'ASC']] }),
    SessionModel.findAll({
      attributes: ['athleteId', [fn('MAX', col('completed_at')), 'lastCompletedAt']],
      where: { status: 'completed' },
      group: ['athleteId'],
      raw: true,
    }) as unknown as Promise<Array<{ athleteId: number; lastCompletedAt: string | null }>>,
  ])
  const lastByUser = new Map(lastSessions.map((s) => [s.athleteId, s.lastCompletedAt]))
  return users.map((u) => toRow(u, lastByUser.get(u.id)))
}

export async function updateUser(admin: UserModel, userId: number, input: AdminUpdateUserInput) {
  const user = await UserModel.findByPk(userId)
  if (!user) throw AppError.notFound('User')
  if (user.id === admin.id && (input.active === false || (input.role && input.role !== 'admin'))) {
    throw AppError.conflict('own_account', 'You cannot switch off or demote your own admin account')
  }
  // A role change or switch-off ends the user's current sign-ins.
  const endsSessions = (input.role && input.role !== user.role) || input.active === false
  await user.update({ ...input, ...(endsSessions ? { tokenVersion: user.tokenVersion + 1 } : {}) })
  const last = await SessionModel.max('completedAt', { where: { athleteId: user.id, status: 'completed' } })
  return toRow(user, last as Date | null)
}
