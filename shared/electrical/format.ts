/** Number formatting for formulas and messages: fixed significant decimals, no trailing zeros. */
export function fmt(value: number, decimals = 2): string {
  if (!Number.isFinite(value)) return String(value)
  const rounded = Number(value.toFixed(decimals))
  return (Object.is(rounded, -0) ? 0 : rounded).toLocaleString('en-US', {
    maximumFractionDigits: decimals,
    useGrouping: false,
  })
}
