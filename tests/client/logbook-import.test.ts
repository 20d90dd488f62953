import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import type { Exercise } from '@shared/schemas/exercise.schema'
import type { ImportMapping, ImportPreview, ImportRow } from '@shared/schemas/logbook.schema'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'
import { useSessionStore } from '@/stores/session'
import LogbookImportView from '@/views/LogbookImportView.vue'
import { buildUser, stubFetch } from './helpers/fetch-stub'

let pinia: Pinia
let router: Router

beforeEach(async () => {
  pinia = createPinia()
  setActivePinia(pinia)
  useSessionStore().user = buildUser({ unit: 'kg' })
  useSessionStore().token = 'tok'
  setAuthToken('tok')
  router = createAppRouter(createMemoryHistory())
  await router.push('/logbook/import')
})

afterEach(() => {
  setAuthToken(null)
  vi.unstubAllGlobals()
})

const CSV = 'Date,Lift,Weight,Reps,Comment\n2026-11-02,Bench press,100,7,felt good\n2026-11-02,Zercher squat,80,8,\n'
const guessed: ImportMapping = { date: 'Date', exercise: 'Lift', load: 'Weight', reps: 'Reps', unit: null, rir: null, note: null, kind: null }
const row = (overrides: Partial<ImportRow>): ImportRow => ({
  line: 2, date: '2026-11-02', exercise: 'Bench press', loadKg: 100, reps: 7, rir: null, note: null, kind: 'straight', errors: [], ...overrides,
})
const preview = (overrides: Partial<ImportPreview> = {}): ImportPreview => ({
  headers: ['Date', 'Lift', 'Weight', 'Reps', 'Comment'],
  mapping: guessed,
  rows: [row({}), row({ line: 3, exercise: 'Zercher squat', loadKg: 80, reps: 8 })],
  rowCount: 2,
  errorCount: 0,
  unknownExercises: [],
  ...overrides,
})
const unknownZercher = preview({
  rows: [row({}), row({ line: 3, exercise: 'Zercher squat', loadKg: 80, reps: 8, errors: ['Unknown exercise "Zercher squat": map it or add it'] })],
  errorCount: 1,
  unknownExercises: ['Zercher squat'],
})
const frontSquat: Exercise = {
  id: 21, name: 'Front squat', pattern: 'squat', primaryMuscles: ['quads'], secondaryMuscles: ['glutes'],
  equipmentKind: 'barbell', loadMode: 'external', loadStepKg: 0, defaultRestSec: 180, custom: false,
}

async function pickFile(wrapper: VueWrapper, csv = CSV) {
  const input = wrapper.get('[data-testid="import-file"]')
  Object.defineProperty(input.element, 'files', { value: [new File([csv], 'old-log.csv', { type: 'text/csv' })], configurable: true })
  await input.trigger('change')
  await flushPromises()
}

async function openImport(...replies: Array<{ status: number; body?: unknown }>) {
  const stub = stubFetch(...replies)
  const wrapper = mount(LogbookImportView, { global: { plugins: [pinia, router] } })
  await flushPromises()
  return { wrapper, ...stub }
}

const confirmButton = (wrapper: VueWrapper) => wrapper.get('[data-testid="import-confirm"]')

describe('LogbookImportView', () => {
  it('sends the file text and the chosen unit to preview, and shows the guessed columns and the rows', async () => {
    const { wrapper, requests } = await openImport({ status: 200, body: { preview: preview() } }, { status: 200, body: { preview: preview() } })

    await pickFile(wrapper)
    expect(requests[0]).toMatchObject({ method: 'POST', url: '/api/logbook/import/preview', body: { csv: CSV, unit: 'kg', exerciseMap: {} } })
    expect(requests[0].body).not.toHaveProperty('mapping')
    expect(requests[0].headers.Authorization).toBe('Bearer tok')
    expect((wrapper.get('[data-testid="map-exercise"]').element as HTMLSelectElement).value).toBe('Lift')
    expect((wrapper.get('[data-testid="map-note"]').element as HTMLSelectElement).value).toBe('')
    expect(wrapper.findAll('[data-testid="import-row"]')).toHaveLength(2)

    await wrapper.get('[data-testid="import-unit"]').setValue('lb')
    await flushPromises()
    expect(requests[1].body).toMatchObject({ unit: 'lb', mapping: guessed })
  })

  it('previews again with the new mapping when a column is changed', async () => {
    const { wrapper, requests } = await openImport(
      { status: 200, body: { preview: preview() } },
      { status: 200, body: { preview: preview({ mapping: { ...guessed, note: 'Comment' } }) } },
    )
    await pickFile(wrapper)

    await wrapper.get('[data-testid="map-note"]').setValue('Comment')
    await flushPromises()

    expect(requests).toHaveLength(2)
    expect(requests[1]).toMatchObject({ method: 'POST', url: '/api/logbook/import/preview' })
    expect(requests[1].body).toEqual({ csv: CSV, unit: 'kg', mapping: { ...guessed, note: 'Comment' }, exerciseMap: {} })
  })

  it('keeps the import button disabled while any row has an error, and shows each row error', async () => {
    const badLoad = preview({ rows: [row({ loadKg: null, errors: ['Load "heavy" is not a number'] }), row({ line: 3 })], errorCount: 1 })
    const { wrapper, requests } = await openImport(
      { status: 200, body: { preview: badLoad } },
      { status: 200, body: { preview: preview({ mapping: { ...guessed, load: 'Reps' } }) } },
    )
    await pickFile(wrapper)

    expect(confirmButton(wrapper).attributes('disabled')).toBeDefined()
    expect(wrapper.get('[data-testid="import-row-error"]').text()).toBe('Line 2: Load "heavy" is not a number')
    await confirmButton(wrapper).trigger('click')
    await flushPromises()
    expect(requests).toHaveLength(1) // no import was sent

    await wrapper.get('[data-testid="map-load"]').setValue('Reps')
    await flushPromises()
    expect(wrapper.find('[data-testid="import-row-error"]').exists()).toBe(false)
    expect(confirmButton(wrapper).attributes('disabled')).toBeUndefined()
    expect(confirmButton(wrapper).text()).toBe('Import 2 sets')
  })

  it('maps an unknown exercise to "new" in exerciseMap, then imports and says what was imported', async () => {
    const mapped = preview({ unknownExercises: ['Zercher squat'] })
    const { wrapper, requests } = await openImport(
      { status: 200, body: { preview: unknownZercher } },
      { status: 200, body: { exercises: [frontSquat] } },
      { status: 200, body: { preview: mapped } },
      { status: 201, body: { result: { sessionsCreated: 1, setsCreated: 2, setsAlreadyThere: 0, exercisesCreated: 1 } } },
    )
    await pickFile(wrapper)

    expect(requests[1]).toMatchObject({ method: 'GET', url: '/api/exercises' })
    const picker = wrapper.get('[data-testid="map-exercise-0"]')
    expect(picker.findAll('option').map((o) => o.text())).toEqual(['Choose…', 'Add as my own exercise', 'Front squat'])
    expect(confirmButton(wrapper).attributes('disabled')).toBeDefined()

    await picker.setValue('new')
    await flushPromises()
    expect(requests[2].body).toEqual({ csv: CSV, unit: 'kg', mapping: guessed, exerciseMap: { 'Zercher squat': 'new' } })

    await confirmButton(wrapper).trigger('click')
    await flushPromises()
    expect(requests[3]).toMatchObject({ method: 'POST', url: '/api/logbook/import', body: { csv: CSV, unit: 'kg', mapping: guessed, exerciseMap: { 'Zercher squat': 'new' } } })
    expect(wrapper.get('[data-testid="import-result"]').text()).toBe('1 session, 2 sets imported; 0 already there. 1 exercise added to your library.')
  })

  it('maps an unknown exercise to a library exercise by its id', async () => {
    const { wrapper, requests } = await openImport(
      { status: 200, body: { preview: unknownZercher } },
      { status: 200, body: { exercises: [frontSquat] } },
      { status: 200, body: { preview: preview({ unknownExercises: ['Zercher squat'] }) } },
    )
    await pickFile(wrapper)

    await wrapper.get('[data-testid="map-exercise-0"]').setValue('21')
    await flushPromises()

    expect((requests[2].body as { exerciseMap: unknown }).exerciseMap).toEqual({ 'Zercher squat': 21 })
  })

  it('reports the totals of a large import, sets already there included', async () => {
    const big = preview({ rowCount: 340 })
    const { wrapper } = await openImport(
      { status: 200, body: { preview: big } },
      { status: 201, body: { result: { sessionsCreated: 12, setsCreated: 340, setsAlreadyThere: 0, exercisesCreated: 0 } } },
    )
    await pickFile(wrapper)

    expect(confirmButton(wrapper).text()).toBe('Import 340 sets')
    expect(wrapper.get('[data-testid="import-counts"]').text()).toContain('340 rows in the file, the first 2 shown')
    await confirmButton(wrapper).trigger('click')
    await flushPromises()

    expect(wrapper.get('[data-testid="import-result"]').text()).toBe('12 sessions, 340 sets imported; 0 already there.')
  })

  it('shows why a file cannot be read (the server refusal) and offers no import', async () => {
    const { wrapper } = await openImport({
      status: 400,
      body: { error: { code: 'bad_request', message: 'This is not a CSV text file', issues: [{ path: 'csv', message: 'This is not a CSV text file' }] } },
    })
    await pickFile(wrapper, 'PK\u0000\u0003binary')

    expect(wrapper.get('[data-testid="import-problem"]').text()).toContain('This is not a CSV text file')
    expect(wrapper.find('[data-testid="import-confirm"]').exists()).toBe(false)
  })

  it('offers the file columns to map by hand when the server could not guess them, and previews once all four are set', async () => {
    const csv = 'when,what,kg,n\n2026-11-02,Bench press,100,7\n'
    const { wrapper, requests } = await openImport(
      { status: 400, body: { error: { code: 'bad_request', message: 'Could not find the date, exercise, load and reps columns', issues: [{ path: 'mapping', message: 'Columns found: when, what, kg, n.' }] } } },
      { status: 200, body: { preview: preview({ headers: ['when', 'what', 'kg', 'n'], mapping: { ...guessed, date: 'when', exercise: 'what', load: 'kg', reps: 'n' }, rowCount: 1, rows: [row({})] }) } },
    )
    await pickFile(wrapper, csv)

    expect(wrapper.get('[data-testid="map-date"]').findAll('option').map((o) => o.text())).toEqual(['Choose a column', 'when', 'what', 'kg', 'n'])
    await wrapper.get('[data-testid="map-date"]').setValue('when')
    await wrapper.get('[data-testid="map-exercise"]').setValue('what')
    await wrapper.get('[data-testid="map-load"]').setValue('kg')
    await flushPromises()
    expect(requests).toHaveLength(1) // reps still missing: nothing sent yet

    await wrapper.get('[data-testid="map-reps"]').setValue('n')
    await flushPromises()
    expect(requests[1].body).toMatchObject({ mapping: { date: 'when', exercise: 'what', load: 'kg', reps: 'n', unit: null, rir: null, note: null, kind: null } })
    expect(confirmButton(wrapper).attributes('disabled')).toBeUndefined()
  })
})
