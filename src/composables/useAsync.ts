import type { Ref, ShallowRef } from 'vue'
import { useAsyncState } from '@vueuse/core'
import { useRouter } from 'vue-router'
import { ApiError } from '@/api/client'
import { useSessionStore } from '@/stores/session'

export interface AsyncData<T> {
  data: ShallowRef<T | undefined>
  loading: Ref<boolean>
  error: Ref<unknown>
  refresh: () => Promise<void>
}

/**
 * Loads view data once on setup and again on refresh(), showing `initial` (a copy kept on the
 * phone) until the first answer arrives. The one place where an expired
 * session (HTTP 401) is handled: the session is cleared and the user sent to sign in.
 */
export function useAsync<T>(load: () => Promise<T>, options: { initial?: T } = {}): AsyncData<T> {
  const session = useSessionStore()
  const router = useRouter()

  const { state, isLoading, error, execute } = useAsyncState<T | undefined>(load, options.initial, {
    resetOnExecute: false,
    onError(e) {
      if (e instanceof ApiError && e.status === 401) {
        session.clear()
        const redirect = router.currentRoute.value.fullPath
        void router.replace({ name: 'sign-in', query: { redirect } })
      }
    },
  })

  return {
    data: state,
    loading: isLoading,
    error,
    refresh: async () => {
      await execute()
    },
  }
}
