import type { CreateInviteInput } from '@shared/schemas/invite.schema'
import * as invitesApi from '@/api/invites'
import { useAsync } from './useAsync'

/** The coach's invitations, and sending a new one (the list is reloaded after). */
export function useInvites() {
  const list = useAsync(invitesApi.listInvites)

  async function send(input: CreateInviteInput) {
    const invite = await invitesApi.createInvite(input)
    await list.refresh()
    return invite
  }

  return { ...list, send }
}
