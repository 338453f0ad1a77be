import type { z } from 'zod'

/** One input of an equipment form, found by reading the shared zod schema of the item's spec. */
export interface SpecField {
  /** Dotted path inside `spec`, e.g. `pvInput.mpptMinV`. */
  path: string
  label: string
  /** Unit read from the field name's ending (…V, …A, …W, …C, …Mm, …Kwh, …Percent). */
  unit: string
  input: 'number' | 'choice' | 'switch'
  options: (string | number)[]
  /** May be left empty (null). */
  nullable: boolean
  /** Nullable group (an optional coefficient, the PV input): shown with a "given" switch. */
  group: string | null
  /** The group is left out of a new item (its schema defaults it to null). */
  groupStartsEmpty: boolean
}

interface Def {
  type: string
  innerType?: { def: Def }
  shape?: Record<string, { def: Def }>
  entries?: Record<string, string>
  values?: (string | number)[]
  options?: { def: Def }[]
  defaultValue?: unknown
}
const defOf = (schema: unknown) => (schema as { def: Def }).def

const UNIT_ENDINGS: [RegExp, string][] = [
  [/Percent$/, '%'], [/Kwh$/, 'kWh'], [/Mm$/, 'mm'], [/Deg$/, '°'], [/V$/, 'V'], [/A$/, 'A'], [/W$/, 'W'], [/C$/, '°C'],
]

/** `maxDcVoltageV` → "Max dc voltage"; the unit goes beside it. */
function words(name: string, unit: string): string {
  const stem = unit ? name.replace(/(Percent|Kwh|Mm|Deg|V|A|W|C)$/, '') : name
  const spaced = stem.replace(/([a-z0-9])([A-Z])/g, '$1 $2')
  const sentence = spaced.charAt(0).toUpperCase() + spaced.slice(1).replace(/ ([A-Z][a-z])/g, (m) => m.toLowerCase())
  return sentence.replace(/\b(mppt|dc|ac|pv)\b/gi, (acronym) => acronym.toUpperCase())
}

function collect(schema: unknown, prefix: string, group: { name: string; startsEmpty: boolean } | null, into: SpecField[]): void {
  for (const [name, child] of Object.entries(defOf(schema).shape ?? {})) {
    const path = prefix ? `${prefix}.${name}` : name
    let def = child.def
    let nullable = false
    let defaultsToNull = false
    while (def.type === 'default' || def.type === 'nullable' || def.type === 'optional') {
      if (def.type === 'default') defaultsToNull = def.defaultValue === null
      else nullable = true
      def = def.innerType!.def
    }
    if (def.type === 'object') {
      collect({ def }, path, nullable ? { name: path, startsEmpty: defaultsToNull } : group, into)
      continue
    }
    const unit = UNIT_ENDINGS.find(([ending]) => ending.test(name))?.[1] ?? ''
    const label = prefix && name === 'value' ? words(prefix, '') : prefix && name === 'unit' ? `${words(prefix, '')} unit` : words(name, unit)
    const base = { path, label, unit, nullable, group: group?.name ?? null, groupStartsEmpty: group?.startsEmpty ?? false }
    if (def.type === 'number') into.push({ ...base, input: 'number', options: [] })
    else if (def.type === 'boolean') into.push({ ...base, input: 'switch', options: [] })
    else if (def.type === 'enum') into.push({ ...base, input: 'choice', options: Object.values(def.entries ?? {}) })
    else if (def.type === 'literal') into.push({ ...base, input: 'choice', options: def.values ?? [] })
    else if (def.type === 'union') into.push({ ...base, input: 'choice', options: (def.options ?? []).flatMap((o) => o.def.values ?? []) })
  }
}

/** Every input of a spec schema, in schema order. */
export function specFields(schema: z.ZodType): SpecField[] {
  const fields: SpecField[] = []
  collect(schema, '', null, fields)
  return fields
}

/** An empty spec for a new item: numbers empty, choices at their first option, groups given unless they default to none. */
export function blankSpec(fields: SpecField[]): Record<string, unknown> {
  const spec: Record<string, unknown> = {}
  for (const field of fields) {
    if (field.group && field.groupStartsEmpty) {
      spec[field.group] = null
      continue
    }
    const keys = field.path.split('.')
    const last = keys.pop()!
    let node = spec
    for (const key of keys) node = (node[key] ??= {}) as Record<string, unknown>
    node[last] = field.input === 'choice' ? field.options[0] : field.input === 'switch' ? false : null
  }
  return spec
}
