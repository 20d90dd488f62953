import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { TOKEN_STORAGE_KEY, useSessionStore } from '@/stores/session'
import SignInView from '@/views/SignInView.vue'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  localStorage.clear()
  pinia = createPinia()
  setActivePinia(pinia)
  router = createAppRouter(createMemoryHistory())
  await router.push('/sign-in')
  await router.isReady()
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

async function fillAndSubmit(email: string, password: string) {
  const wrapper = mount(SignInView, { global: { plugins: [pinia, router] } })
  await wrapper.find('input[type="email"]').setValue(email)
  await wrapper.find('input[type="password"]').setValue(password)
  await wrapper.find('form').trigger('submit')
  await flushPromises()
  await flushPromises()
  return wrapper
}

describe('SignInView', () => {
  it('labels its fields "E-mail" and "Password" and its button "Sign in"', () => {
    const wrapper = mount(SignInView, { global: { plugins: [pinia, router] } })

    const labels = wrapper.findAll('label').map((label) => label.text())
    expect(labels).toEqual(expect.arrayContaining(['E-mail', 'Password']))
    expect(wrapper.find('button[type="submit"]').text()).toBe('Sign in')
  })

  it('posts the e-mail and password, keeps the token and takes a lifter to Train', async () => {
    const user = buildUser({ role: 'lifter' })
    const { requests } = stubFetch({ status: 200, body: { token: 'tok-1', user } })

    await fillAndSubmit('  Robin@Example.com ', 'correct horse battery')
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('train'))

    expect(requests[0]).toMatchObject({
      method: 'POST',
      url: '/api/auth/sign-in',
      body: { email: 'robin@example.com', password: 'correct horse battery' },
    })
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBe('tok-1')
    expect(useSessionStore().user).toEqual(user)
  })

  it('sends nothing and shows the schema message when the e-mail is not an address', async () => {
    const { fetchMock } = stubFetch()

    const wrapper = await fillAndSubmit('robin-at-home', 'whatever')

    expect(fetchMock).not.toHaveBeenCalled()
    expect(wrapper.text()).toContain('Enter a valid e-mail address')
  })

  it('shows "Wrong e-mail or password" when the server refuses the credentials', async () => {
    stubFetch({ status: 401, body: { error: { code: 'invalid_credentials', message: 'Invalid credentials' } } })

    const wrapper = await fillAndSubmit('robin@example.com', 'wrong password')

    await vi.waitFor(() => expect(wrapper.find('[role="alert"]').text()).toBe('Wrong e-mail or password'))
    expect(router.currentRoute.value.name).toBe('sign-in')
  })

  it('shows a server validation issue under the field it names', async () => {
    stubFetch({
      status: 400,
      body: {
        error: {
          code: 'validation_failed',
          message: 'Invalid input',
          issues: [{ path: 'password', message: 'Password is too long' }],
        },
      },
    })

    const wrapper = await fillAndSubmit('robin@example.com', 'some password')

    await vi.waitFor(() => {
      const passwordField = wrapper.findAll('.van-field').find((field) => field.text().includes('Password'))
      expect(passwordField?.find('.van-field__error-message').text()).toBe('Password is too long')
    })
  })
})
