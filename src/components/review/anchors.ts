import type { CommentAnchor } from '@shared/schemas/review'

/** The sheets of a plan set in the order it prints them; a comment may also name a sub-sheet (E-602.2) typed in. */
export const PLAN_SET_SHEETS = [
  { id: 'G-001', title: 'Cover sheet' },
  { id: 'E-101', title: 'Array layout' },
  { id: 'E-601', title: 'Single-line diagram' },
  { id: 'E-602', title: 'Calculations' },
  { id: 'E-603', title: 'Labels and placards' },
  { id: 'E-604', title: 'Equipment schedule' },
] as const

export const ANCHOR_KIND_LABELS: Record<CommentAnchor['kind'], string> = { general: 'General', sheet: 'Sheet', circuit: 'Circuit' }

/** What a comment is pinned to, as its badge reads: “General”, “Sheet E-601”, “Circuit R3”. */
export function anchorLabel(anchor: CommentAnchor): string {
  if (anchor.kind === 'sheet') return `Sheet ${anchor.sheetId}`
  if (anchor.kind === 'circuit') return `Circuit ${anchor.circuitId}`
  return ANCHOR_KIND_LABELS.general
}
