import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { aMember, errorResponse, jsonResponse, sessionOf } from '@/testing/fixtures'
import { useAuthStore } from './auth'

const coordinator = aMember('coordinator')

describe('auth store', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    localStorage.clear()
    sessionStorage.clear()
  })

  it('keeps the access token in memory only', async () => {
    vi.stubGlobal('fetch', async () => jsonResponse(200, sessionOf(coordinator)))
    const auth = useAuthStore()

    await auth.signIn({ email: coordinator.email, password: 'a long enough password' })

    expect(auth.token).toBe('token-for-coordinator')
    expect(auth.user).toEqual(coordinator)
    expect(localStorage.length).toBe(0)
    expect(sessionStorage.length).toBe(0)
    expect(document.cookie).toBe('')
  })

  it('ends the local session on sign-out even when the server cannot be reached', async () => {
    vi.stubGlobal('fetch', async (url: string) =>
      url === '/api/auth/login' ? jsonResponse(200, sessionOf(coordinator)) : Promise.reject(new TypeError('Failed to fetch')),
    )
    const auth = useAuthStore()
    await auth.signIn({ email: coordinator.email, password: 'a long enough password' })

    await expect(auth.signOut()).rejects.toMatchObject({ code: 'network_error' })
    expect(auth.isSignedIn).toBe(false)
    expect(auth.token).toBeNull()
  })

  it('starts signed out when the server fails while resuming the session', async () => {
    vi.stubGlobal('fetch', async () => errorResponse(503, 'unavailable', 'Database is starting'))
    const auth = useAuthStore()

    await expect(auth.restore()).resolves.toBeUndefined()
    expect(auth.isSignedIn).toBe(false)
  })

  it('updates the signed-in member only with their own record', async () => {
    vi.stubGlobal('fetch', async () => jsonResponse(200, sessionOf(coordinator)))
    const auth = useAuthStore()
    await auth.restore()

    auth.replaceUser(aMember('designer', { name: 'Someone Else' }))
    expect(auth.user?.name).toBe(coordinator.name)
    auth.replaceUser({ ...coordinator, name: 'Priya Calder-Ngata' })
    expect(auth.user?.name).toBe('Priya Calder-Ngata')
  })
})
