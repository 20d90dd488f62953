import { afterAll, beforeEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import type { Role } from '@shared/schemas/common.schema'
import { createAppRouter } from '@/router'
import AppTabBar from '@/components/app/AppTabBar.vue'
import { useSessionStore } from '@/stores/session'
import { buildUser } from './helpers/fetch-stub'

beforeEach(() => setActivePinia(createPinia()))
// Vant's tab bar measures itself 100, 200 and 300 ms after mounting (safe-area padding): let
// those timers run before the test environment is taken down.
afterAll(() => new Promise((resolve) => setTimeout(resolve, 350)))

/** Mounts the tab bar after the router's first navigation (and its lazy view) has settled. */
async function mountTabBar(role: Role) {
  const router = createAppRouter(createMemoryHistory())
  await router.push('/sign-in')
  await router.isReady()
  return mount(AppTabBar, { props: { role }, global: { plugins: [router] } })
}

async function tabLabels(role: Role) {
  const wrapper = await mountTabBar(role)
  const labels = wrapper.findAll('.van-tabbar-item').map((item) => item.text())
  wrapper.unmount()
  return labels
}

describe('AppTabBar', () => {
  it('gives a lifter Train, Logbook, Plan and Me', async () => {
    expect(await tabLabels('lifter')).toEqual(['Train', 'Logbook', 'Plan', 'Me'])
  })

  it('gives a coach Athletes, Review desk, Plans and Me', async () => {
    expect(await tabLabels('coach')).toEqual(['Athletes', 'Review desk', 'Plans', 'Me'])
  })

  it('gives an admin Accounts and Me', async () => {
    expect(await tabLabels('admin')).toEqual(['Accounts', 'Me'])
  })

  it('draws its own SVG icons instead of the icon font', async () => {
    const wrapper = await mountTabBar('lifter')

    expect(wrapper.findAll('svg.tab-icon')).toHaveLength(4)
    expect(wrapper.find('.van-icon').exists()).toBe(false)
    wrapper.unmount()
  })
})

describe('AppTabBar on a page below a tab', () => {
  it('keeps Review desk active while the coach reviews one session (/review/12)', async () => {
    const session = useSessionStore()
    session.token = 'token'
    session.user = buildUser({ role: 'coach' })
    const router = createAppRouter(createMemoryHistory())
    await router.push('/review/12')
    await router.isReady()
    const wrapper = mount(AppTabBar, { props: { role: 'coach' }, global: { plugins: [router] } })
    expect(router.currentRoute.value.path).toBe('/review/12')
    expect(wrapper.find('.van-tabbar-item--active').text()).toBe('Review desk')
    wrapper.unmount()
  })
})
