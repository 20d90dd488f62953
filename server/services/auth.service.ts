import bcrypt from 'bcryptjs'
import type { ChangePasswordInput, RegisterInput, SignInInput, UpdateProfileInput } from '@shared/schemas/auth.schema'
import type { AppConfig } from '../config'
import { PasswordResetModel, UserModel } from '../db'
import { AppError } from '../errors'
import type { Mailer } from '../mail/mailer'
import { passwordResetMail } from '../mail/templates'
import { hashLinkToken, newLinkToken } from './token-hash'
import type { UploadStorage } from '../storage/upload-storage'
import { removeFilesOf } from './upload.service'
import { handOverExercisesOf } from './exercise.service'
import { assertNotCommonPassword } from './password-policy'
import { issueToken } from './token.service'
import { toUser } from './presenters'

/** A password reset link works for one hour. */
const RESET_TTL_MS = 3_600_000

// Compared against when the e-mail is unknown, so a wrong e-mail costs as long as a wrong password.
let unknownUserHash: Promise<string> | undefined
function hashForUnknownUser(cost: number) {
  unknownUserHash ??= bcrypt.hash('no account has this password', cost)
  return unknownUserHash
}

export async function register(config: AppConfig, input: RegisterInput) {
  assertNotCommonPassword(input.password)
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

/** Always answers the same way, so nobody learns which e-mails have accounts. */
export async function requestPasswordReset(config: AppConfig, mailer: Mailer, email: string, now = new Date()) {
  const user = await UserModel.findOne({ where: { email } })
  if (!user || !user.active) return
  const { token, hash } = newLinkToken()
  const expiresAt = new Date(now.getTime() + RESET_TTL_MS)
  await PasswordResetModel.create({ userId: user.id, tokenHash: hash, expiresAt, usedAt: null })
  await mailer.send(passwordResetMail(user.email, user.name, `${config.appUrl}/reset-password/${token}`, expiresAt))
}

/** Sets the new password once per link and signs the user out everywhere else. */
export async function resetPassword(config: AppConfig, token: string, password: string, now = new Date()) {
  assertNotCommonPassword(password)
  return PasswordResetModel.sequelize!.transaction(async (transaction) => {
    const reset = await PasswordResetModel.findOne({ where: { tokenHash: hashLinkToken(token) }, transaction })
    if (!reset || reset.usedAt || reset.expiresAt.getTime() <= now.getTime()) {
      throw new AppError(410, 'reset_link_invalid', 'This link has expired or was already used: ask for a new one')
    }
    const user = await UserModel.findByPk(reset.userId, { transaction })
    if (!user) throw AppError.notFound('User')
    await reset.update({ usedAt: now }, { transaction })
    await user.update(
      { passwordHash: await bcrypt.hash(password, config.bcryptCost), tokenVersion: user.tokenVersion + 1 },
      { transaction },
    )
    return { token: issueToken(config, user), user: toUser(user) }
  })
}

/**
 * Changes the password of a signed-in user. Every token issued before stops working (the token
 * version moves on), so other devices are signed out; the caller gets a fresh token to stay in.
 */
export async function changePassword(config: AppConfig, user: UserModel, input: ChangePasswordInput) {
  if (!(await bcrypt.compare(input.currentPassword, user.passwordHash))) {
    throw AppError.badRequest('Your current password is not right', [
      { path: 'currentPassword', message: 'This is not your current password' },
    ])
  }
  assertNotCommonPassword(input.newPassword, 'newPassword')
  await user.update({ passwordHash: await bcrypt.hash(input.newPassword, config.bcryptCost), tokenVersion: user.tokenVersion + 1 })
  return { token: issueToken(config, user), user: toUser(user) }
}

/**
 * Deletes the account and everything that is only the user's (sessions, sets, videos and their
 * files). Exercises they made stay, as private copies, with the people who trained with them.
 */
export async function deleteAccount(storage: UploadStorage, user: UserModel, password: string) {
  if (!(await bcrypt.compare(password, user.passwordHash))) throw new AppError(401, 'invalid_credentials', 'Wrong password')
  await removeFilesOf(storage, { ownerId: user.id })
  await UserModel.sequelize!.transaction(async (transaction) => {
    await handOverExercisesOf(user, transaction)
    await user.destroy({ transaction })
  })
}
