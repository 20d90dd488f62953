import { z } from './zod'
import { roleSchema, unitSchema } from './common.schema'

export const PASSWORD_MIN_LENGTH = 10

export const emailSchema = z.pipe(
  z.string().check(z.trim(), z.toLowerCase()),
  z.email('Enter a valid e-mail address').check(z.maxLength(254)),
)

export const passwordSchema = z.string().check(
  z.minLength(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`),
  z.maxLength(128, 'Use at most 128 characters'),
)

export const displayNameSchema = z.string().check(z.trim(), z.minLength(1, 'Enter your name'), z.maxLength(80, 'Use at most 80 characters'))

/** Self-registration: lifters and coaches only; admins are made by an admin. */
export const registerSchema = z.object({
  name: displayNameSchema,
  email: emailSchema,
  password: passwordSchema,
  role: z.enum(['lifter', 'coach']),
  unit: z._default(unitSchema, 'kg'),
})
export type RegisterInput = z.infer<typeof registerSchema>

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().check(z.minLength(1, 'Enter your password'), z.maxLength(128)),
})
export type SignInInput = z.infer<typeof signInSchema>

/** A coach's e-mail about completed sessions: each one, a daily digest, or none. */
export const notifyCompletedSchema = z.enum(['each', 'daily', 'off'])
export type NotifyCompleted = z.infer<typeof notifyCompletedSchema>

/** What the API tells a client about a user (never the password hash). */
export const userSchema = z.object({
  id: z.int(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
  unit: unitSchema,
  active: z.boolean(),
  /** When the user confirmed the training cautions; null until the first sign-in shows them. */
  cautionsAcknowledgedAt: z.nullable(z.string()),
  notifyCompleted: notifyCompletedSchema,
  createdAt: z.string(),
})
export type User = z.infer<typeof userSchema>

export const authResponseSchema = z.object({ token: z.string(), user: userSchema })
export type AuthResponse = z.infer<typeof authResponseSchema>

/** `{ user }`: what the profile routes answer, the same shared user schema. */
export const userEnvelopeSchema = z.object({ user: userSchema })

export const updateProfileSchema = z
  .partial(z.object({ name: displayNameSchema, unit: unitSchema, notifyCompleted: notifyCompletedSchema }))
  .check(z.refine((v) => Object.keys(v).length > 0, 'Send at least one field'))
export type UpdateProfileInput = z.infer<typeof updateProfileSchema>

/** Deleting an account asks for the password once more. */
export const deleteAccountSchema = z.object({ password: z.string().check(z.minLength(1, 'Enter your password'), z.maxLength(128)) })

/** Changing the password while signed in asks for the current one; other devices are signed out. */
export const changePasswordSchema = z.object({
  currentPassword: z.string().check(z.minLength(1, 'Enter your current password'), z.maxLength(128)),
  newPassword: passwordSchema,
}).check(
  z.refine((v) => v.currentPassword !== v.newPassword, { path: ['newPassword'], message: 'Choose a password you are not using now' }),
)
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>
