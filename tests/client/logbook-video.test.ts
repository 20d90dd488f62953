import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { SessionReview } from '@shared/schemas/review.schema'
import type { SessionDetail, SetLog } from '@shared/schemas/session.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import SessionDetailView from '@/views/SessionDetailView.vue'
import { uuid } from './helpers/run-fixtures'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().token = 'tok'
  setAuthToken('tok')
  router = createAppRouter(createMemoryHistory())
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

function setLog(overrides: Partial<SetLog>): SetLog {
  return {
    id: uuid(), sessionId: 41, exerciseId: 1, exerciseName: 'Bench press', position: 0, kind: 'top',
    targetLoadKg: 100, targetRepsMin: 6, targetRepsMax: 9, toFailure: true,
    loadKg: 100, reps: 7, rir: null, failure: true, note: null, loggedAt: '2026-12-01T11:30:00.000Z', videoId: null,
    ...overrides,
  }
}
const topSet = setLog({ position: 2 })
const backoff = setLog({ position: 3, kind: 'backoff', targetLoadKg: 85, loadKg: 85, reps: 10, failure: false, videoId: 5 })
const unlogged = setLog({ position: 4, kind: 'backoff', loadKg: null, reps: null, loggedAt: null })
const detail: SessionDetail = {
  id: 41, athleteId: 12, dayName: 'Push', version: 'I', status: 'completed',
  startedAt: '2026-12-01T11:00:00.000Z', completedAt: '2026-12-01T12:00:00.000Z', workingSets: 2, volumeKg: 1550, records: 0, note: null,
  sets: [topSet, backoff, unlogged],
}
const review: SessionReview = { reviewedAt: null, reviewedBy: null, flags: [], comments: [] }
const video = (id: number, setLogId: string) => ({ id, setLogId, mimeType: 'video/mp4', sizeBytes: 1_200_000, createdAt: '2026-12-01T12:10:00.000Z' })

async function openSession(viewer: 'owner' | 'coach', ...more: Array<{ status: number; body?: unknown }>) {
  useSessionStore().user = viewer === 'owner' ? buildUser({ id: 12, role: 'lifter' }) : buildUser({ id: 3, role: 'coach', name: 'Dana Reyes' })
  await router.push('/logbook/41')
  const stub = stubFetch({ status: 200, body: { session: detail } }, { status: 200, body: { review } }, ...more)
  const wrapper = mount(SessionDetailView, { props: { id: 41 }, global: { plugins: [pinia, router] }, attachTo: document.body })
  await flushPromises()
  return { wrapper, ...stub }
}

const row = (wrapper: ReturnType<typeof mount>, set: SetLog) => wrapper.get(`[data-testid="logbook-set"][data-set-id="${set.id}"]`)

async function chooseFile(wrapper: ReturnType<typeof mount>, set: SetLog, file: File) {
  const input = row(wrapper, set).get('[data-testid="video-input"]')
  Object.defineProperty(input.element, 'files', { value: [file], configurable: true })
  await input.trigger('change')
  await flushPromises()
}

describe('Form-check videos on the session page', () => {
  it('offers the owner a camera-ready video input on each logged set without a video, none on an unlogged set', async () => {
    const { wrapper } = await openSession('owner')

    const input = row(wrapper, topSet).get('[data-testid="video-input"]')
    expect(input.attributes()).toMatchObject({ type: 'file', accept: 'video/*', capture: 'environment' })
    expect(row(wrapper, backoff).find('[data-testid="video-input"]').exists()).toBe(false) // it has a video
    expect(row(wrapper, unlogged).find('[data-testid="video-input"]').exists()).toBe(false)
    wrapper.unmount()
  })

  it('posts the chosen file as multipart in the field "video" and then offers to play it', async () => {
    const { wrapper, requests } = await openSession('owner', { status: 201, body: { video: video(9, topSet.id) } })
    const file = new File(['not really mp4 bytes'], 'bench.mp4', { type: 'video/mp4' })

    await chooseFile(wrapper, topSet, file)

    expect(requests[2]).toMatchObject({ method: 'POST', url: `/api/sets/${topSet.id}/video` })
    expect(requests[2].headers.Authorization).toBe('Bearer tok')
    expect(requests[2].headers['Content-Type']).toBeUndefined() // the browser writes the multipart boundary
    const body = requests[2].body
    expect(body).toBeInstanceOf(FormData)
    const sent = (body as FormData).get('video') as File
    expect(sent.name).toBe('bench.mp4')
    expect(await sent.text()).toBe('not really mp4 bytes')
    expect(row(wrapper, topSet).find('[data-testid="video-play"]').exists()).toBe(true)
    wrapper.unmount()
  })

  it('says the file is not a video when the server answers 415', async () => {
    const { wrapper } = await openSession('owner', {
      status: 415, body: { error: { code: 'not_a_video', message: 'Unsupported media type' } },
    })

    await chooseFile(wrapper, topSet, new File(['%PDF'], 'plan.pdf', { type: 'application/pdf' }))

    expect(row(wrapper, topSet).get('[data-testid="video-error"]').text()).toBe(
      'That file is not a video. Choose a video from the camera or the gallery.',
    )
    expect(row(wrapper, topSet).find('[data-testid="video-input"]').exists()).toBe(true)
    wrapper.unmount()
  })

  it('says the video is too large when the server answers 413', async () => {
    const { wrapper } = await openSession('owner', {
      status: 413, body: { error: { code: 'file_too_large', message: 'Payload too large' } },
    })

    await chooseFile(wrapper, topSet, new File(['x'], 'long.mov', { type: 'video/quicktime' }))

    expect(row(wrapper, topSet).get('[data-testid="video-error"]').text()).toContain('That video is too large')
    wrapper.unmount()
  })

  it('play fetches a signed address and puts it in the video element', async () => {
    const url = '/api/uploads/5/stream?sig=abc123'
    const { wrapper, requests } = await openSession('owner', { status: 200, body: { url, video: video(5, backoff.id) } })

    await row(wrapper, backoff).get('[data-testid="video-play"]').trigger('click')
    await flushPromises()

    expect(requests[2]).toMatchObject({ method: 'GET', url: '/api/uploads/5/url' })
    const player = document.querySelector<HTMLVideoElement>('[data-testid="video-player"]')
    expect(player?.getAttribute('src')).toBe(url)
    expect(player?.hasAttribute('controls')).toBe(true)
    expect(player?.hasAttribute('playsinline')).toBe(true)
    wrapper.unmount()
  })

  it('a coach watches the video but cannot add or delete one', async () => {
    const { wrapper } = await openSession('coach')

    expect(row(wrapper, backoff).find('[data-testid="video-play"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="video-delete"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="video-input"]').exists()).toBe(false)
    wrapper.unmount()
  })

  it('the owner deletes a video after confirming, and may add a new one', async () => {
    const { wrapper, requests } = await openSession('owner', { status: 204 })

    await row(wrapper, backoff).get('[data-testid="video-delete"]').trigger('click')
    await flushPromises()
    document.querySelector<HTMLButtonElement>('.van-dialog__confirm')?.click()
    await flushPromises()

    expect(requests[2]).toMatchObject({ method: 'DELETE', url: '/api/uploads/5' })
    expect(row(wrapper, backoff).find('[data-testid="video-play"]').exists()).toBe(false)
    expect(row(wrapper, backoff).find('[data-testid="video-input"]').exists()).toBe(true)
    wrapper.unmount()
  })
})
