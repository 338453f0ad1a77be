/**
 * What differs between two versions of a design document, leaf by leaf, for the "someone else
 * saved first" dialog. Array items that carry an `id` are matched by it, so a removed string does
 * not make every later one look changed.
 */

export interface DocumentChange {
  /** e.g. `topology.runs[R3].lengthFt` */
  path: string
  /** Value in the version both sides started from; undefined when the field is new. */
  before: unknown
  /** Value in the other person's saved version; undefined when they removed it. */
  theirs: unknown
  /** Value in this editor now. */
  mine: unknown
}

type Leaves = Map<string, unknown>

const hasId = (value: unknown): value is { id: string } =>
  typeof value === 'object' && value !== null && typeof (value as { id?: unknown }).id === 'string'

function collectLeaves(value: unknown, path: string, into: Leaves): Leaves {
  if (Array.isArray(value)) {
    if (value.length === 0) into.set(path, '[]')
    value.forEach((item, index) => collectLeaves(item, `${path}[${hasId(item) ? item.id : index}]`, into))
  } else if (typeof value === 'object' && value !== null) {
    for (const [key, item] of Object.entries(value)) collectLeaves(item, path ? `${path}.${key}` : key, into)
  } else {
    into.set(path, value)
  }
  return into
}

export function leavesOf(document: unknown): Leaves {
  return collectLeaves(document, '', new Map())
}

/** Every field the other save changed from the common starting point, with what this editor holds. */
export function changesBySomeoneElse(before: unknown, theirs: unknown, mine: unknown): DocumentChange[] {
  const base = leavesOf(before)
  const other = leavesOf(theirs)
  const own = leavesOf(mine)
  const paths = new Set([...base.keys(), ...other.keys()])
  const changes: DocumentChange[] = []
  for (const path of paths) {
    if (base.get(path) !== other.get(path)) changes.push({ path, before: base.get(path), theirs: other.get(path), mine: own.get(path) })
  }
  return changes.sort((a, b) => a.path.localeCompare(b.path))
}

/** How many fields this editor changed since the common starting point. */
export function countOwnChanges(before: unknown, mine: unknown): number {
  const base = leavesOf(before)
  const own = leavesOf(mine)
  let count = 0
  for (const path of new Set([...base.keys(), ...own.keys()])) if (base.get(path) !== own.get(path)) count++
  return count
}
