import bcrypt from 'bcryptjs'
import type { AcceptInviteInput, CreateInviteInput, Invite, InvitePreview } from '@shared/schemas/invite.schema'
import type { AppConfig } from '../config'
import { CoachAthleteModel, InviteModel, UserModel } from '../db'
import { AppError } from '../errors'
import type { Mailer } from '../mail/mailer'
import { invitationMail } from '../mail/templates'
import { hashLinkToken, newLinkToken } from './token-hash'
import { issueToken } from './token.service'
import { toUser } from './presenters'
import { assertNotCommonPassword } from './password-policy'

const HOUR_MS = 3_600_000

function toInvite(invite: InviteModel): Invite {
  return {
    id: invite.id,
    name: invite.name,
    email: invite.email,
    expiresAt: invite.expiresAt.toISOString(),
    acceptedAt: invite.acceptedAt?.toISOString() ?? null,
  }
}

/** Creates a single-use invitation that expires, and e-mails its link. */
export async function createInvite(config: AppConfig, mailer: Mailer, coach: UserModel, input: CreateInviteInput, now = new Date()) {
  const existing = await UserModel.findOne({ where: { email: input.email } })
  if (existing && existing.role !== 'lifter') {
    throw AppError.conflict('not_a_lifter', 'That e-mail belongs to a coach or admin account')
  }
  if (existing && (await CoachAthleteModel.count({ where: { coachId: coach.id, athleteId: existing.id } })) > 0) {
    throw AppError.conflict('already_your_athlete', 'This lifter is already your athlete')
  }
  const { token, hash } = newLinkToken()
  const invite = await InviteModel.create({
    coachId: coach.id,
    email: input.email,
    name: input.name,
    tokenHash: hash,
    expiresAt: new Date(now.getTime() + config.inviteTtlHours * HOUR_MS),
    acceptedAt: null,
  })
  const url = `${config.appUrl}/invite/${token}`
  await mailer.send(invitationMail(input.email, input.name, coach.name, url, invite.expiresAt))
  return toInvite(invite)
}

export async function listInvites(coach: UserModel) {
  const invites = await InviteModel.findAll({ where: { coachId: coach.id }, order: [['createdAt', 'DESC']], limit: 200 })
  return invites.map(toInvite)
}

/** The invitation behind a link, if it still works: 404 unknown, 410 used or expired. */
async function usableInvite(token: string, now: Date) {
  const invite = await InviteModel.findOne({ where: { tokenHash: hashLinkToken(token) } })
  if (!invite) throw AppError.notFound('Invitation')
  if (invite.acceptedAt) throw new AppError(410, 'invite_used', 'This invitation has already been used')
  if (invite.expiresAt.getTime() <= now.getTime()) throw new AppError(410, 'invite_expired', 'This invitation has expired: ask your coach for a new one')
  return invite
}

export async function previewInvite(token: string, now = new Date()): Promise<InvitePreview> {
  const invite = await usableInvite(token, now)
  const [coach, existing] = await Promise.all([
    UserModel.findByPk(invite.coachId),
    UserModel.findOne({ where: { email: invite.email } }),
  ])
  return { coachName: coach?.name ?? 'Your coach', name: invite.name, email: invite.email, existingAccount: existing !== null }
}

/**
 * Accepts an invitation: a new lifter sets a password and their unit (and is signed in); an
 * existing lifter must be signed in as the invited e-mail and keeps their unit. Either way the
 * lifter is linked to the coach and the link stops working.
 */
export async function acceptInvite(config: AppConfig, token: string, input: AcceptInviteInput, signedIn: UserModel | null, now = new Date()) {
  const sequelize = InviteModel.sequelize!
  return sequelize.transaction(async (transaction) => {
    const invite = await usableInvite(token, now)
    let lifter = await UserModel.findOne({ where: { email: invite.email }, transaction })
    let newToken: string | null = null
    if (lifter) {
      if (!signedIn || signedIn.id !== lifter.id) {
        throw new AppError(401, 'sign_in_to_accept', `Sign in as ${invite.email} to accept this invitation`)
      }
    } else {
      if (!input.password) throw AppError.badRequest('Choose a password', [{ path: 'password', message: 'Choose a password' }])
      assertNotCommonPassword(input.password)
      lifter = await UserModel.create(
        {
          name: input.name ?? invite.name, email: invite.email, role: 'lifter', unit: input.unit ?? 'kg', clubId: null,
          passwordHash: await bcrypt.hash(input.password, config.bcryptCost), cautionsAcknowledgedAt: null,
        },
        { transaction },
      )
      newToken = issueToken(config, lifter)
    }
    // Marking it used inside the transaction, after re-reading it, makes the link single-use.
    const [used] = await InviteModel.update({ acceptedAt: now }, { where: { id: invite.id, acceptedAt: null }, transaction })
    if (used === 0) throw new AppError(410, 'invite_used', 'This invitation has already been used')
    await CoachAthleteModel.findOrCreate({
      where: { coachId: invite.coachId, athleteId: lifter.id },
      defaults: { coachId: invite.coachId, athleteId: lifter.id },
      transaction,
    })
    return { token: newToken, user: toUser(lifter) }
  })
}

/** Ends the coaching link; the athlete keeps their account and all their data. */
export async function removeAthlete(coach: UserModel, athleteId: number) {
  const removed = await CoachAthleteModel.destroy({ where: { coachId: coach.id, athleteId } })
  if (removed === 0) throw AppError.notFound('Athlete')
}
