const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' })
const dateTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' })

/** An ISO timestamp with its time of day, in the reader's locale and zone. */
export const formatDateTime = (iso: string) => dateTimeFormat.format(new Date(iso))

/** A `YYYY-MM-DD` calendar date or an ISO timestamp, as the reader's locale writes dates. */
export function formatDate(value: string | null): string {
  if (!value) return '—'
  const calendar = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value)
  // a bare calendar date is local, not UTC midnight (which would show the day before in the Americas)
  const date = calendar ? new Date(Number(calendar[1]), Number(calendar[2]) - 1, Number(calendar[3])) : new Date(value)
  return Number.isNaN(date.getTime()) ? value : dateFormat.format(date)
}

/** Today as `YYYY-MM-DD` in the reader's time zone. */
export function todayIso(now: Date = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0')
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`
}

/** Days from `fromIso` to `toIso`, both `YYYY-MM-DD`. */
export function daysBetween(fromIso: string, toIso: string): number {
  const utc = (iso: string) => Date.UTC(Number(iso.slice(0, 4)), Number(iso.slice(5, 7)) - 1, Number(iso.slice(8, 10)))
  return Math.round((utc(toIso) - utc(fromIso)) / 86_400_000)
}
