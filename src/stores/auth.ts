import { acceptHMRUpdate, defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { PublicUser } from '@shared/schemas/account'
import { http } from '../api/http'

type Message = { message: string }
export type AuthStatus = 'unknown' | 'loading' | 'ready'

/**
 * Who is signed in, and the account actions. Actions reject with ApiError (with field messages); pages
 * show them. No toasts here.
 */
export const useAuthStore = defineStore('auth', () => {
  const user = ref<PublicUser | null>(null)
  const status = ref<AuthStatus>('unknown')
  let loading: Promise<void> | null = null

  const signedIn = computed(() => user.value !== null)
  const isAdmin = computed(() => user.value?.role === 'admin')
  const isAdvisor = computed(() => user.value?.role === 'advisor')

  /** Ask the server who is signed in (once; again with force). */
  function ensureLoaded(force = false): Promise<void> {
    if (status.value === 'ready' && !force) return Promise.resolve()
    if (loading && !force) return loading
    status.value = status.value === 'ready' ? 'ready' : 'loading'
    loading = http
      .get<{ user: PublicUser | null }>('/auth/me')
      .then((r) => {
        user.value = r.user
      })
      .catch(() => {
        user.value = null
      })
      .finally(() => {
        status.value = 'ready'
        loading = null
      })
    return loading
  }

  /** A 401 anywhere: the session is gone. */
  function forget(): void {
    user.value = null
  }

  async function signIn(email: string, password: string): Promise<PublicUser> {
    const r = await http.post<{ user: PublicUser }>('/auth/sign-in', { email, password })
    user.value = r.user
    status.value = 'ready'
    return r.user
  }

  function signUp(input: { email: string; displayName: string; password: string }): Promise<Message> {
    return http.post<Message>('/auth/sign-up', input)
  }

  async function verifyEmail(token: string): Promise<PublicUser> {
    const r = await http.post<{ user: PublicUser }>('/auth/verify-email', { token })
    user.value = r.user
    status.value = 'ready'
    return r.user
  }

  async function confirmEmailChange(token: string): Promise<PublicUser> {
    const r = await http.post<{ user: PublicUser }>('/auth/confirm-email-change', { token })
    if (user.value?.id === r.user.id) user.value = r.user
    return r.user
  }

  function forgotPassword(email: string): Promise<Message> {
    return http.post<Message>('/auth/forgot-password', { email })
  }

  async function resetPassword(token: string, password: string): Promise<Message> {
    const r = await http.post<Message>('/auth/reset-password', { token, password })
    user.value = null
    return r
  }

  async function signOut(everywhere = false): Promise<void> {
    await http.post(everywhere ? '/auth/sign-out-everywhere' : '/auth/sign-out')
    user.value = null
  }

  async function updateProfile(
    changes: Partial<Pick<PublicUser, 'displayName' | 'unitSystem' | 'temperatureUnit' | 'currency'>>,
  ): Promise<PublicUser> {
    const r = await http.patch<{ user: PublicUser }>('/account/profile', {
      ...changes,
      version: user.value?.version,
    })
    user.value = r.user
    return r.user
  }

  function changePassword(currentPassword: string, newPassword: string): Promise<Message> {
    return http.post<Message>('/account/password', { currentPassword, newPassword })
  }

  function changeEmail(newEmail: string, password: string): Promise<Message> {
    return http.post<Message>('/account/email', { newEmail, password })
  }

  return {
    user,
    status,
    signedIn,
    isAdmin,
    isAdvisor,
    ensureLoaded,
    forget,
    signIn,
    signUp,
    verifyEmail,
    confirmEmailChange,
    forgotPassword,
    resetPassword,
    signOut,
    updateProfile,
    changePassword,
    changeEmail,
  }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useAuthStore, import.meta.hot))
