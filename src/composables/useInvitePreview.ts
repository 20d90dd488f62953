import { inviteTokenParamsSchema } from '@shared/schemas/invite.schema'
import { ApiError } from '@/api/client'
import { previewInvite } from '@/api/invites'
import { useAsync } from './useAsync'

/**
 * What an invitation link offers (coach, invitee, new or existing account). A link that cannot
 * be a token is a 404 without asking the server; 410 'invite_used' / 'invite_expired' come as errors.
 */
export function useInvitePreview(token: string) {
  return useAsync(async () => {
    if (!inviteTokenParamsSchema.shape.token.safeParse(token).success) {
      throw new ApiError(404, 'not_found', 'Invitation not found')
    }
    return previewInvite(token)
  })
}
