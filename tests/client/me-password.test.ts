import { describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { type Pinia } from 'pinia'
import { TOKEN_STORAGE_KEY, useSessionStore } from '@/stores/session'
import MePasswordForm from '@/components/me/MePasswordForm.vue'
import { useAppHarness } from './helpers/app-harness'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
useAppHarness((p) => {
  pinia = p
})

function signedIn() {
  const session = useSessionStore()
  session.start('tok-before', buildUser())
  return session
}

async function openForm() {
  const view = mount(MePasswordForm, { global: { plugins: [pinia] }, attachTo: document.body })
  expect(view.find('[data-testid="current-password"]').exists()).toBe(false)
  await view.get('[data-testid="password-toggle"]').trigger('click')
  return view
}

async function fill(view: Awaited<ReturnType<typeof openForm>>, current: string, next: string) {
  await view.get('[data-testid="current-password"] input').setValue(current)
  await view.get('[data-testid="new-password"] input').setValue(next)
  await view.get('form').trigger('submit')
  await flushPromises()
  await flushPromises()
}

describe('changing the password on the Me page', () => {
  it('posts both passwords, switches this device to the new token and folds the form away', async () => {
    signedIn()
    const user = buildUser()
    const { requests } = stubFetch({ status: 200, body: { token: 'tok-after', user } })
    const view = await openForm()

    await fill(view, 'my old long password', 'my new long password')

    expect(requests).toEqual([
      expect.objectContaining({
        method: 'POST',
        url: '/api/me/password',
        body: { currentPassword: 'my old long password', newPassword: 'my new long password' },
      }),
    ])
    expect(requests[0]!.headers.Authorization).toBe('Bearer tok-before')
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBe('tok-after')
    expect(view.find('[data-testid="current-password"]').exists()).toBe(false)
    view.unmount()
  })

  it('shows the server\'s message under the current password when it is wrong, and stays signed in', async () => {
    const session = signedIn()
    stubFetch({
      status: 400,
      body: { error: { code: 'bad_request', message: 'Your current password is not right', issues: [{ path: 'currentPassword', message: 'This is not your current password' }] } },
    })
    const view = await openForm()

    await fill(view, 'a wrong password', 'my new long password')

    expect(view.text()).toContain('This is not your current password')
    expect(session.token).toBe('tok-before')
    view.unmount()
  })

  it('refuses a short new password or the same password without posting', async () => {
    signedIn()
    const { requests } = stubFetch()
    const view = await openForm()

    await fill(view, 'my old long password', 'short')
    expect(view.text()).toContain('Use at least 10 characters')
    await fill(view, 'my old long password', 'my old long password')
    expect(view.text()).toContain('Choose a password you are not using now')

    expect(requests).toHaveLength(0)
    view.unmount()
  })
})
