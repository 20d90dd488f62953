import { afterEach, beforeEach, vi } from 'vitest'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, type Router } from 'vue-router'
import { setAuthToken } from '@/api/client'
import { createAppRouter } from '@/router'

/**
 * A fresh store and the app's real router (in memory) before each test, and a clean page,
 * token and fetch after it. `ready` receives them for the test file's own variables.
 */
export function useAppHarness(ready: (pinia: Pinia, router: Router) => void) {
  beforeEach(() => {
    localStorage.clear()
    const pinia = createPinia()
    setActivePinia(pinia)
    ready(pinia, createAppRouter(createMemoryHistory()))
  })
  afterEach(() => {
    setAuthToken(null)
    vi.unstubAllGlobals()
    document.body.innerHTML = ''
  })
}
