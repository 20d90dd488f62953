import { beforeAll, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { type Pinia } from 'pinia'
import { RouterView, type Router } from 'vue-router'
import type { Invite } from '@shared/schemas/invite.schema'
import { setAuthToken } from '@/api/client'
import { useSessionStore } from '@/stores/session'
import AthletesPendingInvites from '@/components/coach/AthletesPendingInvites.vue'
import { useAppHarness } from './helpers/app-harness'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeAll(async () => {
  await import('@/views/AthletesView.vue')
}, 30_000)

useAppHarness((p, r) => {
  pinia = p
  router = r
})

const pending: Invite = { id: 11, name: 'Noor Vale', email: 'noor@example.com', expiresAt: '2026-12-08T10:00:00.000Z', acceptedAt: null }
const accepted: Invite = { id: 10, name: 'Ada Quill', email: 'ada@example.com', expiresAt: '2026-11-20T10:00:00.000Z', acceptedAt: '2026-11-14T10:00:00.000Z' }
const expired: Invite = { id: 9, name: 'Old Link', email: 'old@example.com', expiresAt: '2026-11-01T10:00:00.000Z', acceptedAt: null }

async function openInviteSheet(...afterLoad: Array<{ status: number; body?: unknown }>) {
  const stub = stubFetch({ status: 200, body: { athletes: [] } }, { status: 200, body: { invites: [] } }, ...afterLoad)
  const session = useSessionStore()
  session.user = buildUser({ role: 'coach' })
  session.token = 'tok'
  setAuthToken('tok')
  await router.push('/athletes')
  const view = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  await view.get('[data-testid="invite-athlete"]').trigger('click')
  await flushPromises()
  return { view, ...stub }
}

async function fillAndSend(view: VueWrapper, name: string, email: string) {
  await view.get('[data-testid="invite-name"] input').setValue(name)
  await view.get('[data-testid="invite-email"] input').setValue(email)
  await view.get('[data-testid="invite-sheet"] form').trigger('submit')
  await flushPromises()
  await flushPromises()
}

describe('inviting an athlete', () => {
  it('sends nothing and shows the schema messages when the name is empty and the e-mail is not an address', async () => {
    const { view, requests } = await openInviteSheet()

    await fillAndSend(view, '  ', 'sam-at-home')

    expect(requests).toHaveLength(2)
    expect(view.text()).toContain('Enter your name')
    expect(view.text()).toContain('Enter a valid e-mail address')
    view.unmount()
  })

  it('posts the trimmed name and lower-cased e-mail, says where it went and lists the new invitation', async () => {
    const invite: Invite = { id: 12, name: 'Sam Ortiz', email: 'sam@example.com', expiresAt: '2026-12-09T10:00:00.000Z', acceptedAt: null }
    const { view, requests } = await openInviteSheet(
      { status: 201, body: { invite } },
      { status: 200, body: { invites: [invite] } },
    )

    await fillAndSend(view, ' Sam Ortiz ', 'Sam@Example.com ')

    expect(requests[2]).toMatchObject({
      method: 'POST',
      url: '/api/invites',
      body: { name: 'Sam Ortiz', email: 'sam@example.com' },
      headers: { Authorization: 'Bearer tok' },
    })
    expect(requests[3]).toMatchObject({ method: 'GET', url: '/api/invites' })
    await vi.waitFor(() => expect(document.body.textContent).toContain('Invitation sent to sam@example.com'))
    expect(view.get('[data-testid="pending-invites"]').text()).toContain('Sam Ortiz')
    view.unmount()
  })

  it('explains a refusal when the e-mail already belongs to one of the athletes', async () => {
    const { view } = await openInviteSheet({
      status: 409,
      body: { error: { code: 'already_your_athlete', message: 'This lifter is already your athlete' } },
    })

    await fillAndSend(view, 'Ada Quill', 'ada@example.com')

    expect(view.get('[data-testid="invite-sheet"] [role="alert"]').text()).toBe('That lifter is already your athlete.')
    view.unmount()
  })
})

describe('AthletesPendingInvites', () => {
  it('lists only invitations not accepted yet, with their expiry, and marks the expired ones', () => {
    const wrapper = mount(AthletesPendingInvites, {
      props: { invites: [pending, accepted, expired], now: new Date('2026-12-02T10:00:00.000Z') },
    })

    const items = wrapper.findAll('[data-testid="pending-invite"]').map((item) => item.text())
    expect(items).toHaveLength(2)
    expect(items[0]).toContain('Noor Vale')
    expect(items[0]).toContain('Expires Tue, Dec 8, 2026')
    expect(items[1]).toContain('Old Link')
    expect(items[1]).toContain('Expired')
    expect(wrapper.text()).not.toContain('Ada Quill')
  })

  it('says so when no invitation is waiting', () => {
    const wrapper = mount(AthletesPendingInvites, { props: { invites: [accepted], now: new Date('2026-12-02T10:00:00.000Z') } })
    expect(wrapper.find('[data-testid="pending-invites"]').exists()).toBe(false)
    expect(wrapper.text()).toContain('No invitations waiting for an answer.')
  })
})
