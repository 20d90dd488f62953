import { z } from '@shared/schemas/zod'
import { userSchema, type User } from '@shared/schemas/auth.schema'
import {
  invitePreviewSchema,
  inviteSchema,
  type AcceptInviteInput,
  type CreateInviteInput,
  type Invite,
  type InvitePreview,
} from '@shared/schemas/invite.schema'
import { request } from './client'

const inviteEnvelopeSchema = z.object({ invite: inviteSchema })
const inviteListSchema = z.object({ invites: z.array(inviteSchema) })
const previewEnvelopeSchema = z.object({ invite: invitePreviewSchema })
/** A new lifter is signed in by the answer (token); an existing one already was (token null). */
const acceptResponseSchema = z.object({ token: z.nullable(z.string()), user: userSchema })
export type AcceptInviteResult = { token: string | null; user: User }

/** Sends an invitation e-mail; 409 'not_a_lifter' or 'already_your_athlete'. */
export async function createInvite(input: CreateInviteInput): Promise<Invite> {
  return (await request('POST', '/invites', { body: input, schema: inviteEnvelopeSchema })).invite
}

/** The coach's invitations, newest first, accepted ones included. */
export async function listInvites(): Promise<Invite[]> {
  return (await request('GET', '/invites', { schema: inviteListSchema })).invites
}

/** What the invitation link shows; 404 unknown, 410 'invite_used' or 'invite_expired'. */
export async function previewInvite(token: string): Promise<InvitePreview> {
  return (await request('GET', `/invites/${encodeURIComponent(token)}`, { schema: previewEnvelopeSchema })).invite
}

/** 401 'sign_in_to_accept' when an existing account is not the one signed in. */
export function acceptInvite(token: string, input: AcceptInviteInput): Promise<AcceptInviteResult> {
  return request('POST', `/invites/${encodeURIComponent(token)}/accept`, { body: input, schema: acceptResponseSchema })
}
