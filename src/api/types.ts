import type { USER_SORTS as SORTS, UserDto } from '@shared/schemas/auth'

export type { CreateUserBody, LoginBody, UpdateUserBody } from '@shared/schemas/auth'
export { USER_SORTS } from '@shared/schemas/auth'
export type { Page } from '@shared/schemas/paging'

/** A member of an installer organisation, as the API returns it. */
export type User = UserDto
export type UserSort = (typeof SORTS)[number]

/** Answer of sign-in and refresh: a short-lived access token and the signed-in user. */
export interface AuthSession {
  token: string
  user: User
}

export interface UserListQuery {
  page: number
  pageSize: number
  q?: string
  sort?: UserSort
}

export interface FieldError {
  field: string
  message: string
}

/** Shape of every error answer of the API. */
export interface ApiErrorBody {
  error: { code: string; message: string; fields?: FieldError[] }
}
