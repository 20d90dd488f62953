import type {
  AuthResponse,
  ChangePasswordInput,
  RegisterInput,
  SignInInput,
  UpdateProfileInput,
  User,
} from '@shared/schemas/auth.schema'
import { request } from './client'

// The session store (on every page's start-up path) uses this module: the schemas load with
// the request that needs them, never at start-up (see client.ts).
const authSchemas = () => import('@shared/schemas/auth.schema')
const authResponseSchema = () => authSchemas().then((m) => m.authResponseSchema)
const userEnvelopeSchema = () => authSchemas().then((m) => m.userEnvelopeSchema)

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
