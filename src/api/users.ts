import { api } from './client'
import type { MemberDto } from '@shared/schemas/auth'
import type { CreateUserBody, Page, UpdateUserBody, User, UserListQuery } from './types'

export const usersApi = {
  /** Active members (id, name, role): every role may read them. */
  members: () => api.get<{ items: MemberDto[] }>('/members').then((answer) => answer.items),
  list: (query: UserListQuery) => api.get<Page<User>>('/users', { ...query }),
  create: (body: CreateUserBody) => api.post<{ user: User }>('/users', body).then((answer) => answer.user),
  update: (id: string, body: UpdateUserBody) =>
    api.patch<{ user: User }>(`/users/${encodeURIComponent(id)}`, body).then((answer) => answer.user),
}
