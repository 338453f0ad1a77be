const sizeFormat = new Intl.NumberFormat(undefined, { maximumFractionDigits: 1 })

/** A byte count as people read file sizes (binary multiples, as file managers show them). */
export function formatBytes(bytes: number): string {
  const units = ['B', 'KiB', 'MiB', 'GiB']
  let value = bytes
  let unit = 0
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024
    unit += 1
  }
  return `${unit === 0 ? value : sizeFormat.format(value)} ${units[unit]}`
}

/** The first 12 hex digits of a SHA-256: enough to tell files apart at a glance; the full value is on hover. */
export const shortHash = (sha256: string) => sha256.slice(0, 12)
