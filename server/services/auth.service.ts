import bcrypt from 'bcryptjs'
import type { RegisterInput, SignInInput, UpdateProfileInput } from '@shared/schemas/auth.schema'
import type { AppConfig } from '../config'
import { UserModel } from '../db'
import { AppError } from '../errors'
import { issueToken } from './token.service'
import { toUser } from './presenters'

// Compared against when the e-mail is unknown, so a wrong e-mail costs as long as a wrong password.
let unknownUserHash: Promise<string> | undefined
function hashForUnknownUser(cost: number) {
  unknownUserHash ??= bcrypt.hash('no account has this password', cost)
  return unknownUserHash
}

export async function register(config: AppConfig, input: RegisterInput) {
  const existing = await UserModel.findOne({ where: { email: input.email } })
  if (existing) throw AppError.conflict('email_taken', 'An account with this e-mail already exists')
  const user = await UserModel.create({
    name: input.name,
    email: input.email,
    passwordHash: await bcrypt.hash(input.password, config.bcryptCost),
    role: input.role,
    unit: input.unit,
    clubId: null,
    cautionsAcknowledgedAt: null,
  })
  return { token: issueToken(config, user), user: toUser(user) }
}

export async function signIn(config: AppConfig, input: SignInInput) {
  const user = await UserModel.findOne({ where: { email: input.email } })
  const passwordMatches = await bcrypt.compare(input.password, user?.passwordHash ?? (await hashForUnknownUser(config.bcryptCost)))
  if (!user || !passwordMatches) {
    throw new AppError(401, 'invalid_credentials', 'Wrong e-mail or password')
  }
  if (!user.active) throw new AppError(401, 'account_disabled', 'This account is switched off')
  return { token: issueToken(config, user), user: toUser(user) }
}

export async function updateProfile(user: UserModel, input: UpdateProfileInput) {
  await user.update(input)
  return toUser(user)
}

export async function acknowledgeCautions(user: UserModel, now = new Date()) {
  if (!user.cautionsAcknowledgedAt) await user.update({ cautionsAcknowledgedAt: now })
  return toUser(user)
}
