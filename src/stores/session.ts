import { computed } from 'vue'
import { acceptHMRUpdate, defineStore } from 'pinia'
import { StorageSerializers, useLocalStorage } from '@vueuse/core'
import type { ChangePasswordInput, RegisterInput, SignInInput, UpdateProfileInput, User } from '@shared/schemas/auth.schema'
import type { Role } from '@shared/schemas/common.schema'
import * as authApi from '@/api/auth'
import { setAuthToken } from '@/api/client'
import { forgetSavedToday } from '@/offline/saved-today'

export const TOKEN_STORAGE_KEY = 'chalkline.token'
export const USER_STORAGE_KEY = 'chalkline.user'

/** The signed-in user and their token, both kept on the phone across reloads. */
export const useSessionStore = defineStore('session', () => {
  const token = useLocalStorage<string | null>(TOKEN_STORAGE_KEY, null)
  // Kept on the phone too, so the app opens signed in with no signal (the gym basement case);
  // it is refreshed from the server whenever there is one.
  const user = useLocalStorage<User | null>(USER_STORAGE_KEY, null, { serializer: StorageSerializers.object })
  setAuthToken(token.value)

  const isSignedIn = computed(() => token.value !== null && token.value !== '')
  const role = computed<Role | null>(() => user.value?.role ?? null)
  const needsCautions = computed(() => user.value !== null && user.value.cautionsAcknowledgedAt === null)

  /** Starts a signed-in session from a token the API handed over (sign-in, accepted invitation, password reset). */
  function start(newToken: string, newUser: User) {
    token.value = newToken
    setAuthToken(newToken)
    user.value = newUser
  }

  /** Forgets the session on this device only (used after sign-out and on a 401). */
  function clear() {
    token.value = null
    setAuthToken(null)
    user.value = null
    forgetSavedToday()
  }

  async function signIn(input: SignInInput) {
    const result = await authApi.signIn(input)
    start(result.token, result.user)
    return result.user
  }

  async function register(input: RegisterInput) {
    const result = await authApi.register(input)
    start(result.token, result.user)
    return result.user
  }

  async function signOut() {
    try {
      await authApi.signOut()
    } finally {
      clear()
    }
  }

  async function fetchMe() {
    user.value = await authApi.getMe()
    return user.value
  }

  async function acknowledgeCautions() {
    user.value = await authApi.acknowledgeCautions()
  }

  async function updateProfile(input: UpdateProfileInput) {
    user.value = await authApi.updateMe(input)
  }

  /** The old token stops working on the server, so this device switches to the new one. */
  async function changePassword(input: ChangePasswordInput) {
    const result = await authApi.changePassword(input)
    start(result.token, result.user)
  }

  return {
    token,
    user,
    isSignedIn,
    role,
    needsCautions,
    start,
    signIn,
    register,
    signOut,
    clear,
    fetchMe,
    acknowledgeCautions,
    updateProfile,
    changePassword,
  }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useSessionStore, import.meta.hot))
