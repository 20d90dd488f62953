import { beforeAll, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { type Pinia } from 'pinia'
import { RouterView, type Router } from 'vue-router'
import { TOKEN_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { useAppHarness } from './helpers/app-harness'
import { buildUser, stubFetch } from './helpers/fetch-stub'

const TOKEN = 'rst_8d1e0c7b6a5f4e3d2c1b'
let pinia: Pinia
let router: Router

beforeAll(async () => {
  await import('@/views/ForgotPasswordView.vue')
  await import('@/views/PasswordResetView.vue')
  await import('@/views/SignInView.vue')
  await import('@/views/AthletesView.vue')
}, 30_000)

useAppHarness((p, r) => {
  pinia = p
  router = r
})

async function open(path: string) {
  await router.push(path)
  const view = mount(RouterView, { global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return view
}

describe('forgotten password', () => {
  it('the sign-in page links to "Forgot your password?"', async () => {
    const view = await open('/sign-in')

    const link = view.get('[data-testid="forgot-password"]')
    expect(link.text()).toBe('Forgot your password?')
    await link.trigger('click')
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('forgot-password'))
    view.unmount()
  })

  it('posts the lower-cased e-mail and answers the same whether or not the account exists', async () => {
    const { requests } = stubFetch({ status: 202, body: { ok: true } })
    const view = await open('/forgot-password')

    await view.get('[data-testid="forgot-email"] input').setValue(' Robin@Example.com')
    await view.get('form').trigger('submit')
    await flushPromises()
    await flushPromises()

    expect(requests).toEqual([
      expect.objectContaining({ method: 'POST', url: '/api/auth/password-reset', body: { email: 'robin@example.com' } }),
    ])
    expect(view.get('[data-testid="reset-sent"]').text()).toContain('If an account exists for that e-mail, we sent a link.')
    view.unmount()
  })

  it('sends nothing for an e-mail that is not an address', async () => {
    const { requests } = stubFetch()
    const view = await open('/forgot-password')

    await view.get('[data-testid="forgot-email"] input').setValue('robin')
    await view.get('form').trigger('submit')
    await flushPromises()

    expect(requests).toHaveLength(0)
    expect(view.text()).toContain('Enter a valid e-mail address')
    view.unmount()
  })
})

describe('PasswordResetView', () => {
  it('posts the new password to the link, keeps the returned token and goes home', async () => {
    const coach = buildUser({ role: 'coach' })
    const { requests } = stubFetch({ status: 200, body: { token: 'tok-reset', user: coach } })
    const view = await open(`/reset-password/${TOKEN}`)

    await view.get('[data-testid="new-password"] input').setValue('a fresh long password')
    await view.get('form').trigger('submit')
    await flushPromises()

    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('athletes'), { timeout: 10_000 })
    expect(requests[0]).toMatchObject({
      method: 'POST', url: `/api/auth/password-reset/${TOKEN}`, body: { password: 'a fresh long password' },
    })
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBe('tok-reset')
    expect(useSessionStore().user).toEqual(coach)
    view.unmount()
  })

  it('says the link is dead on a 410 and offers a new one', async () => {
    stubFetch({ status: 410, body: { error: { code: 'reset_link_invalid', message: 'gone' } } })
    const view = await open(`/reset-password/${TOKEN}`)

    await view.get('[data-testid="new-password"] input').setValue('a fresh long password')
    await view.get('form').trigger('submit')
    await flushPromises()
    await flushPromises()

    const problem = view.get('[data-testid="reset-problem"]')
    expect(problem.text()).toContain('This link has expired or was already used. Ask for a new one.')
    expect(problem.get('a').attributes('href')).toBe('/forgot-password')
    expect(router.currentRoute.value.name).toBe('reset-password')
    view.unmount()
  })

  it('refuses a short password without posting', async () => {
    const { requests } = stubFetch()
    const view = await open(`/reset-password/${TOKEN}`)

    await view.get('[data-testid="new-password"] input').setValue('short')
    await view.get('form').trigger('submit')
    await flushPromises()

    expect(requests).toHaveLength(0)
    expect(view.text()).toContain('Use at least 10 characters')
    view.unmount()
  })
})
