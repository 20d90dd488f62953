import { z } from 'zod'
import {
  authResponseSchema,
  userSchema,
  type AuthResponse,
  type ChangePasswordInput,
  type RegisterInput,
  type SignInInput,
  type UpdateProfileInput,
  type User,
} from '@shared/schemas/auth.schema'
import { request } from './client'

const userEnvelopeSchema = z.object({ user: userSchema })

export function register(input: RegisterInput): Promise<AuthResponse> {
  return request('POST', '/auth/register', { body: input, schema: authResponseSchema })
}

export function signIn(input: SignInInput): Promise<AuthResponse> {
  return request('POST', '/auth/sign-in', { body: input, schema: authResponseSchema })
}

export async function signOut(): Promise<void> {
  await request('POST', '/auth/sign-out')
}

export async function getMe(): Promise<User> {
  return (await request('GET', '/me', { schema: userEnvelopeSchema })).user
}

export async function updateMe(input: UpdateProfileInput): Promise<User> {
  return (await request('PATCH', '/me', { body: input, schema: userEnvelopeSchema })).user
}

export async function acknowledgeCautions(): Promise<User> {
  return (await request('POST', '/me/cautions', { schema: userEnvelopeSchema })).user
}

/** Always 202, whether or not an account exists for the e-mail. */
export async function requestPasswordReset(email: string): Promise<void> {
  await request('POST', '/auth/password-reset', { body: { email } })
}

/** Sets a new password from an e-mailed link and signs in; 410 'reset_link_invalid'. */
export function resetPassword(token: string, password: string): Promise<AuthResponse> {
  return request('POST', `/auth/password-reset/${encodeURIComponent(token)}`, { body: { password }, schema: authResponseSchema })
}

/** Changes the password while signed in; other devices are signed out and this one gets a fresh token. */
export function changePassword(input: ChangePasswordInput): Promise<AuthResponse> {
  return request('POST', '/me/password', { body: input, schema: authResponseSchema })
}
