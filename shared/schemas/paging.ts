import { z } from 'zod'

export const MAX_PAGE_SIZE = 100

/** `page`, `pageSize` (≤ 100), `sort` (one of the list's names, `-` for descending) and `q`. */
export function pageQuery<const S extends readonly [string, ...string[]]>(sorts: S) {
  return z.object({
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(20),
    sort: z.enum(sorts).optional(),
    q: z.string().trim().max(200).optional(),
  })
}

export interface Page<T> {
  items: T[]
  total: number
  page: number
  pageSize: number
}
