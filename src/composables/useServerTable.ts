import { computed, onBeforeUnmount, ref, shallowRef, watch } from 'vue'
import { useRoute, useRouter, type LocationQuery } from 'vue-router'
import { ApiError } from '@/api/errors'
import type { Page } from '@/api/types'
import type { RouteName } from '@/router/routes'

export const PAGE_SIZES = [10, 20, 50, 100]
const SEARCH_PAUSE_MS = 300

/** What a table asks the server for: paging, search, sort and its own filters (empty = not filtered). */
export type TableQuery<F extends string> = { page: number; pageSize: number; q: string; sort: string } & Record<F, string>

interface ServerTableOptions<Row, F extends string> {
  /** The page the table is on: the list loads only while this route is shown. */
  routeName: RouteName
  sorts: readonly string[]
  defaultSort: string
  filters: readonly F[]
  fetch: (query: TableQuery<F>) => Promise<Page<Row>>
}

/**
 * A table paged, searched, sorted and filtered on the server, with its state in the address so
 * reload, back and a shared link show the same rows.
 */
export function useServerTable<Row, F extends string>(options: ServerTableOptions<Row, F>) {
  const route = useRoute()
  const router = useRouter()
  const defaults = { page: 1, pageSize: 20, q: '', sort: options.defaultSort, ...Object.fromEntries(options.filters.map((f) => [f, ''])) } as TableQuery<F>

  function fromAddress(address: LocationQuery): TableQuery<F> {
    const single = (key: string) => (typeof address[key] === 'string' ? (address[key] as string) : undefined)
    const page = Number(single('page'))
    const pageSize = Number(single('pageSize'))
    const sort = single('sort')
    const filters = Object.fromEntries(options.filters.map((f) => [f, single(f) ?? '']))
    return {
      ...filters,
      page: Number.isInteger(page) && page >= 1 ? page : 1,
      pageSize: PAGE_SIZES.includes(pageSize) ? pageSize : defaults.pageSize,
      q: single('q') ?? '',
      sort: sort && options.sorts.includes(sort) ? sort : options.defaultSort,
    } as TableQuery<F>
  }

  const query = computed(() => fromAddress(route.query))

  function change(partial: Partial<TableQuery<F>>): void {
    const next: Record<string, string | number> = { ...query.value, ...partial }
    const address: Record<string, string> = {}
    for (const [key, value] of Object.entries(next)) if (value !== (defaults as Record<string, string | number>)[key]) address[key] = String(value)
    void router.replace({ query: address })
  }

  const rows = shallowRef<Row[]>([])
  const total = ref(0)
  const loading = ref(false)
  const problem = ref<string | null>(null)
  let latest = 0

  async function load(): Promise<void> {
    const ticket = ++latest
    loading.value = true
    try {
      const answer = await options.fetch({ ...query.value, q: query.value.q.trim() })
      if (ticket !== latest) return // a newer request is on its way
      rows.value = answer.items
      total.value = answer.total
      problem.value = null
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      if (ticket === latest) problem.value = error.message
    } finally {
      if (ticket === latest) loading.value = false
    }
  }

  watch(query, () => {
    if (route.name === options.routeName) void load()
  }, { immediate: true })

  const searchText = ref(query.value.q)
  let timer: ReturnType<typeof setTimeout> | undefined
  watch(searchText, (text) => {
    clearTimeout(timer)
    timer = setTimeout(() => change({ q: text, page: 1 } as Partial<TableQuery<F>>), SEARCH_PAUSE_MS)
  })
  onBeforeUnmount(() => clearTimeout(timer))

  const initialSort = (() => {
    const sort = query.value.sort
    const descending = sort.startsWith('-')
    return { prop: descending ? sort.slice(1) : sort, order: descending ? ('descending' as const) : ('ascending' as const) }
  })()

  function onSortChange({ prop, order }: { prop: string | null; order: 'ascending' | 'descending' | null }): void {
    const wanted = prop && order ? (order === 'descending' ? `-${prop}` : prop) : options.defaultSort
    change({ sort: options.sorts.includes(wanted) ? wanted : options.defaultSort, page: 1 } as Partial<TableQuery<F>>)
  }

  return { query, change, rows, total, loading, problem, load, searchText, initialSort, onSortChange }
}
