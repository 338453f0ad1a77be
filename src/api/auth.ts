import { api } from './client'
import type { AuthSession, LoginBody, User } from './types'

export const authApi = {
  login: (body: LoginBody) => api.post<AuthSession>('/auth/login', body, { authenticated: false }),
  logout: () => api.post<void>('/auth/logout'),
  me: () => api.get<{ user: User }>('/auth/me').then((answer) => answer.user),
}
