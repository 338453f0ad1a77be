import { computed, ref } from 'vue'
import { defineStore } from 'pinia'
import type { Role } from '@shared/auth/roles'
import { api } from '@/api/client'
import { authApi } from '@/api/auth'
import type { AuthSession, LoginBody, User } from '@/api/types'

export const useAuthStore = defineStore('auth', () => {
  // memory only: a reload gets a new token from the httpOnly refresh cookie, never from storage
  const token = ref<string | null>(null)
  const user = ref<User | null>(null)
  let restoring: Promise<void> | null = null

  function applySession(session: AuthSession | null): void {
    token.value = session?.token ?? null
    user.value = session?.user ?? null
  }

  api.connectSession({ accessToken: () => token.value, sessionChanged: applySession })

  const isSignedIn = computed(() => user.value !== null && token.value !== null)

  function hasRole(roles: readonly Role[]): boolean {
    return user.value !== null && roles.includes(user.value.role)
  }

  async function signIn(credentials: LoginBody): Promise<User> {
    const session = await authApi.login(credentials)
    applySession(session)
    return session.user
  }

  async function signOut(): Promise<void> {
    try {
      await authApi.logout()
    } finally {
      // the local session ends even when the server cannot be reached
      applySession(null)
    }
  }

  /** Resumes the session from the refresh cookie once per page load; later calls wait for the same. */
  function restore(): Promise<void> {
    restoring ??= api.refreshSession().then(
      () => undefined,
      // server unreachable or failing: start signed out; signing in reports the real problem
      () => applySession(null),
    )
    return restoring
  }

  /** Keeps the header current when an administrator edits their own account. */
  function replaceUser(updated: User): void {
    if (user.value?.id === updated.id) user.value = updated
  }

  return { token, user, isSignedIn, hasRole, signIn, signOut, restore, replaceUser }
})
