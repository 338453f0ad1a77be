import Papa from 'papaparse'
import { z } from 'zod'
import { EQUIPMENT_SPECS, type EquipmentItemBody, type EquipmentKind } from '../../shared/schemas/equipment'

/**
 * The library's CSV format, one file per kind: `manufacturer,model,notes`, then one column per
 * spec field, nested fields dotted (`pvInput.mpptMinV`). Columns come from the kind's schema, so
 * the format follows the engine's equipment schemas without a second list to keep in step.
 */

interface Column {
  /** Header and dotted path inside `spec` (or a top-level field). */
  name: string
  /** JSON types the field accepts, e.g. `number`, `string`, `boolean`. */
  types: Set<string>
  nullable: boolean
  /** The dotted path of the nullable object this column sits in, if any. */
  nullableParent: string | null
}

type JsonSchema = { type?: string | string[]; anyOf?: JsonSchema[]; properties?: Record<string, JsonSchema>; const?: unknown; enum?: unknown[] }

function typesOf(node: JsonSchema): Set<string> {
  const out = new Set<string>()
  const visit = (n: JsonSchema) => {
    if (n.anyOf) n.anyOf.forEach(visit)
    if (typeof n.type === 'string') out.add(n.type === 'integer' ? 'number' : n.type)
    if (Array.isArray(n.type)) n.type.forEach((t) => out.add(t === 'integer' ? 'number' : t))
    if (n.const !== undefined) out.add(typeof n.const)
    n.enum?.forEach((v) => out.add(v === null ? 'null' : typeof v))
  }
  visit(node)
  return out
}

function objectBranch(node: JsonSchema): JsonSchema | undefined {
  if (node.properties) return node
  return node.anyOf?.find((b) => b.properties)
}

function columnsOf(node: JsonSchema, prefix: string, parent: string | null): Column[] {
  return Object.entries(node.properties ?? {}).flatMap(([key, child]) => {
    const name = prefix ? `${prefix}.${key}` : key
    const types = typesOf(child)
    const object = objectBranch(child)
    if (object) return columnsOf(object, name, types.has('null') ? name : parent)
    return [{ name, types, nullable: types.has('null'), nullableParent: parent }]
  })
}

const ITEM_COLUMNS: Column[] = ['manufacturer', 'model', 'notes'].map((name) => ({ name, types: new Set(['string']), nullable: false, nullableParent: null }))
const columnCache = new Map<EquipmentKind, Column[]>()

/** Every column of a kind's CSV, in order. */
export function csvColumns(kind: EquipmentKind): Column[] {
  let columns = columnCache.get(kind)
  if (!columns) {
    const schema = z.toJSONSchema(EQUIPMENT_SPECS[kind], { io: 'input', unrepresentable: 'any' }) as JsonSchema
    columns = [...ITEM_COLUMNS, ...columnsOf(schema, '', null)]
    columnCache.set(kind, columns)
  }
  return columns
}

const valueAt = (obj: unknown, dotted: string): unknown =>
  dotted.split('.').reduce<unknown>((v, key) => (v !== null && typeof v === 'object' ? (v as Record<string, unknown>)[key] : undefined), obj)

/**
 * Text that a spreadsheet would run as a formula gets a leading apostrophe (OWASP "CSV injection");
 * import takes it off again, so export and import round-trip.
 */
const FORMULA_START = /^[=+\-@\t\r]/
const guardFormula = (text: string) => (FORMULA_START.test(text) ? `'${text}` : text)
const unguardFormula = (text: string) => (text.startsWith("'") && FORMULA_START.test(text.slice(1)) ? text.slice(1) : text)
const isText = (c: Column) => c.types.size === 1 && c.types.has('string')

/** Library items as CSV; empty cells are nulls. */
export function toCsv(kind: EquipmentKind, items: Pick<EquipmentItemBody, 'manufacturer' | 'model' | 'notes' | 'spec'>[]): string {
  const columns = csvColumns(kind)
  const rows = items.map((item) =>
    columns.map((c) => {
      const v = ITEM_COLUMNS.includes(c) ? item[c.name as 'manufacturer'] : valueAt(item.spec, c.name)
      if (v === null || v === undefined) return ''
      return isText(c) ? guardFormula(String(v)) : String(v)
    }),
  )
  return Papa.unparse({ fields: columns.map((c) => c.name), data: rows }, { newline: '\r\n' })
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/

/** One cell as the value its column takes; text the column cannot take stays text so validation names it. */
function cellValue(column: Column, raw: string): unknown {
  const text = raw.trim()
  if (text === '') return column.nullable ? null : undefined
  if (column.types.has('number') && NUMBER.test(text)) return Number(text)
  if (column.types.has('boolean') && /^(true|false)$/i.test(text)) return text.toLowerCase() === 'true'
  return isText(column) ? unguardFormula(text) : text
}

function setAt(target: Record<string, unknown>, dotted: string, value: unknown) {
  const keys = dotted.split('.')
  let node = target
  for (const key of keys.slice(0, -1)) node = (node[key] ??= {}) as Record<string, unknown>
  node[keys[keys.length - 1]!] = value
}

/** A CSV record as the JSON an item body would be: nested spec, a nullable group with no cells filled is null. */
export function recordToItem(kind: EquipmentKind, record: Record<string, string>): unknown {
  const item: Record<string, unknown> = { kind, spec: {} }
  const spec = item.spec as Record<string, unknown>
  const columns = csvColumns(kind)
  const emptyGroups = new Set(columns.filter((c) => c.nullableParent).map((c) => c.nullableParent!))
  for (const c of columns) if (c.nullableParent && (record[c.name] ?? '').trim() !== '') emptyGroups.delete(c.nullableParent)
  for (const c of columns) {
    if (c.nullableParent && emptyGroups.has(c.nullableParent)) continue
    const value = cellValue(c, record[c.name] ?? '')
    if (value === undefined) continue
    if (ITEM_COLUMNS.includes(c)) item[c.name] = value
    else setAt(spec, c.name, value)
  }
  for (const group of emptyGroups) setAt(spec, group, null)
  return item
}

export interface ParsedCsv {
  headers: string[]
  records: Record<string, string>[]
  /** Rows Papa Parse could not split (wrong number of cells, bad quotes), 0-based record index. */
  rowErrors: { index: number; message: string }[]
}

export function parseCsv(text: string): ParsedCsv {
  const result = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (h) => h.trim(),
  })
  return {
    headers: result.meta.fields ?? [],
    records: result.data,
    rowErrors: result.errors.filter((e) => e.row !== undefined).map((e) => ({ index: e.row!, message: e.message })),
  }
}
