const POWERS_OF_TEN = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8]

/**
 * Number formatting for formulas and messages: at most `decimals` decimals, no trailing zeros, no
 * grouping. Plain arithmetic because an evaluation formats thousands of numbers (locale
 * formatting costs ~25 µs a call).
 */
export function fmt(value: number, decimals = 2): string {
  if (!Number.isFinite(value)) return String(value)
  const scale = POWERS_OF_TEN[decimals] ?? 10 ** decimals
  const rounded = Math.round(value * scale) / scale
  return rounded === 0 ? '0' : String(rounded)
}
