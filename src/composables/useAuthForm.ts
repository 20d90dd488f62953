import { ref } from 'vue'
import { useRoute, useRouter } from 'vue-router'
import type { User } from '@shared/schemas/auth.schema'
import { ApiError } from '@/api/client'
import { homeRouteFor } from '@/router'
import { fieldErrorsFrom } from '@/utils/server-issues'

/**
 * Runs a sign-in or register call for a form: busy flag, server field errors (400),
 * a form-level message, then on success the page the user came for or their home.
 */
export function useAuthForm<T>(action: (input: T) => Promise<User>, messages: Record<number, string> = {}) {
  const router = useRouter()
  const route = useRoute()
  const loading = ref(false)
  const fieldErrors = ref<Record<string, string>>({})
  const formError = ref<string | null>(null)

  async function submit(input: T) {
    loading.value = true
    fieldErrors.value = {}
    formError.value = null
    try {
      const user = await action(input)
      const redirect = route.query.redirect
      const target = typeof redirect === 'string' && /^\/(?!\/)/.test(redirect) ? redirect : homeRouteFor(user.role)
      await router.replace(target)
    } catch (error) {
      fieldErrors.value = fieldErrorsFrom(error)
      if (Object.keys(fieldErrors.value).length === 0) {
        formError.value =
          error instanceof ApiError
            ? (messages[error.status] ?? error.message)
            : 'Something went wrong. Please try again.'
      }
    } finally {
      loading.value = false
    }
  }

  return { loading, fieldErrors, formError, submit }
}
