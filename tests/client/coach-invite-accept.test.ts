import { beforeAll, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { type Pinia } from 'pinia'
import { RouterView, createMemoryHistory, type Router } from 'vue-router'
import type { InvitePreview } from '@shared/schemas/invite.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { TOKEN_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { useAppHarness } from './helpers/app-harness'
import { buildUser, stubFetch } from './helpers/fetch-stub'

const TOKEN = 'inv_4f9c2a7b1d8e6f3a0c5b'
let pinia: Pinia
let router: Router

beforeAll(async () => {
  await import('@/views/InviteAcceptView.vue')
  await import('@/views/TrainView.vue')
  await import('@/views/SignInView.vue')
}, 30_000)

useAppHarness((p, r) => {
  pinia = p
  router = r
})

const preview = (overrides: Partial<InvitePreview> = {}): InvitePreview => ({
  coachName: 'Mara Lind', name: 'Noor Vale', email: 'noor@example.com', existingAccount: false, ...overrides,
})

async function openInvite() {
  await router.push(`/invite/${TOKEN}`)
  const view = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return view
}

describe('InviteAcceptView', () => {
  it('for a new account sends the name and password, keeps the returned token and goes to Train', async () => {
    const lifter = buildUser({ id: 31, name: 'Noor Vale', email: 'noor@example.com', cautionsAcknowledgedAt: null })
    const { requests } = stubFetch(
      { status: 200, body: { invite: preview() } },
      { status: 200, body: { token: 'tok-new', user: lifter } },
    )
    const view = await openInvite()

    expect(requests[0]).toMatchObject({ method: 'GET', url: `/api/invites/${TOKEN}` })
    expect(view.get('[data-testid="invite-lead"]').text()).toBe('Mara Lind invites you to train with Chalkline.')
    const name = view.get('[data-testid="accept-name"] input')
    expect((name.element as HTMLInputElement).value).toBe('Noor Vale')
    await view.get('[data-testid="accept-password"] input').setValue('long enough secret')
    await view.get('[data-testid="accept-invite"]').trigger('click')
    await flushPromises()

    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('train'), { timeout: 10_000 })
    expect(requests[1]).toMatchObject({
      method: 'POST',
      url: `/api/invites/${TOKEN}/accept`,
      body: { name: 'Noor Vale', password: 'long enough secret', unit: 'kg' },
    })
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBe('tok-new')
    expect(useSessionStore().user).toEqual(lifter)
    // The next request (Train's) carries the new token.
    await vi.waitFor(() => expect(requests[2]?.headers.Authorization).toBe('Bearer tok-new'))
    view.unmount()
  })

  it('asks a new lifter "kg or lb", kg unless they pick lb, and sends the pick', async () => {
    const { requests } = stubFetch(
      { status: 200, body: { invite: preview() } },
      { status: 200, body: { token: 'tok-new', user: buildUser({ email: 'noor@example.com', unit: 'lb' }) } },
    )
    const view = await openInvite()

    const options = view.findAll('[data-testid="accept-unit"] [role="radio"]')
    expect(options.map((o) => [o.text(), o.attributes('aria-checked')])).toEqual([['kg', 'true'], ['lb', 'false']])
    await view.get('[data-testid="accept-unit-lb"]').trigger('click')
    expect(view.get('[data-testid="accept-unit-lb"]').attributes('aria-checked')).toBe('true')
    await view.get('[data-testid="accept-password"] input').setValue('long enough secret')
    await view.get('[data-testid="accept-invite"]').trigger('click')

    // Accepted, the app goes on to Train (whose own request follows).
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('train'), { timeout: 10_000 })
    expect(requests[1]).toMatchObject({ method: 'POST', url: `/api/invites/${TOKEN}/accept` })
    expect(requests[1].body).toEqual({ name: 'Noor Vale', password: 'long enough secret', unit: 'lb' })
    view.unmount()
  })

  it('does not ask an existing account for a unit (theirs stays as it is)', async () => {
    stubFetch({ status: 200, body: { invite: preview({ existingAccount: true }) } })
    const view = await openInvite()

    expect(view.find('[data-testid="accept-unit"]').exists()).toBe(false)
    view.unmount()
  })

  it('refuses a password shorter than the schema allows without posting', async () => {
    const { requests } = stubFetch({ status: 200, body: { invite: preview() } })
    const view = await openInvite()

    await view.get('[data-testid="accept-password"] input').setValue('short')
    await view.get('form').trigger('submit')
    await flushPromises()

    expect(requests).toHaveLength(1)
    expect(view.text()).toContain('Use at least 10 characters')
    view.unmount()
  })

  it('for an existing account without sign-in offers "Sign in to accept" and comes back to the link after', async () => {
    stubFetch({ status: 200, body: { invite: preview({ existingAccount: true }) } })
    const view = await openInvite()

    expect(view.find('[data-testid="accept-password"]').exists()).toBe(false)
    const button = view.get('[data-testid="sign-in-to-accept"]')
    expect(button.text()).toBe('Sign in to accept')
    await button.trigger('click')

    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('sign-in'))
    expect(router.currentRoute.value.query.redirect).toBe(`/invite/${TOKEN}`)
    view.unmount()
  })

  it('for an existing account signed in as the invited e-mail accepts with an empty body and the bearer', async () => {
    const session = useSessionStore()
    session.user = buildUser({ email: 'noor@example.com' })
    session.token = 'tok-old'
    setAuthToken('tok-old')
    const { requests } = stubFetch(
      { status: 200, body: { invite: preview({ existingAccount: true }) } },
      { status: 200, body: { token: null, user: buildUser({ email: 'noor@example.com' }) } },
    )
    const view = await openInvite()

    await view.get('[data-testid="accept-invite"]').trigger('click')
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('train'), { timeout: 10_000 })

    expect(requests[1]).toMatchObject({
      method: 'POST', url: `/api/invites/${TOKEN}/accept`, body: {}, headers: { Authorization: 'Bearer tok-old' },
    })
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBe('tok-old')
    view.unmount()
  })

  it('says an expired link has expired and offers no form', async () => {
    stubFetch({ status: 410, body: { error: { code: 'invite_expired', message: 'This invitation has expired' } } })
    const view = await openInvite()

    expect(view.get('[data-testid="invite-problem"]').text()).toContain('This invitation has expired. Ask your coach to send you a new one.')
    expect(view.find('form').exists()).toBe(false)
    view.unmount()
  })

  it('says a used link was used, and an unknown one is not known', async () => {
    stubFetch({ status: 410, body: { error: { code: 'invite_used', message: 'Used' } } })
    const used = await openInvite()
    expect(used.get('[data-testid="invite-problem"]').text()).toContain('This invitation has already been used.')
    used.unmount()

    router = createAppRouter(createMemoryHistory())
    stubFetch({ status: 404, body: { error: { code: 'not_found', message: 'Invitation not found' } } })
    const unknown = await openInvite()
    expect(unknown.get('[data-testid="invite-problem"]').text()).toContain('This invitation link is not known.')
    unknown.unmount()
  })
})
