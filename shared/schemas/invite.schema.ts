import { z } from './zod'
import { displayNameSchema, emailSchema, passwordSchema } from './auth.schema'
import { unitSchema } from './common.schema'

export const createInviteSchema = z.object({ name: displayNameSchema, email: emailSchema })
export type CreateInviteInput = z.infer<typeof createInviteSchema>

export const inviteTokenParamsSchema = z.object({ token: z.string().check(z.regex(/^[A-Za-z0-9_-]{20,100}$/, 'Not an invitation link')) })

/**
 * A new lifter sets a password and says whether they load in kg or lb (kg when left out; their
 * gym starts from that unit's preset); an existing one accepts while signed in and sends no body
 * fields (their unit stays as it is).
 */
export const acceptInviteSchema = z.object({
  password: z.optional(passwordSchema),
  name: z.optional(displayNameSchema),
  unit: z.optional(unitSchema),
})
export type AcceptInviteInput = z.infer<typeof acceptInviteSchema>

export const inviteSchema = z.object({
  id: z.int(),
  name: z.string(),
  email: z.string(),
  expiresAt: z.string(),
  acceptedAt: z.nullable(z.string()),
})
export type Invite = z.infer<typeof inviteSchema>

/** What the invitation page shows before accepting. */
export const invitePreviewSchema = z.object({
  coachName: z.string(),
  name: z.string(),
  email: z.string(),
  /** An account with this e-mail exists: the invitee signs in to accept. */
  existingAccount: z.boolean(),
})
export type InvitePreview = z.infer<typeof invitePreviewSchema>

export const requestPasswordResetSchema = z.object({ email: emailSchema })
export const resetPasswordSchema = z.object({ password: passwordSchema })
