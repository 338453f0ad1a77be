import {
  INSULATIONS,
  type ConduitConductor,
  type ConduitFill,
  type ConduitFillInput,
  type Derived,
  type EngineIssue,
  type Insulation,
  type Outcome,
} from '../types'
import { fmt } from '../format'
import { CONDUCTOR_AREA_ROW, CONDUCTOR_AREAS_IN2, CONDUCTOR_AREAS_REF } from '../tables/conductor-areas'
import { CONDUIT_FILL_REF, conduitFillLimitPercent } from '../tables/conduit-fill-limits'
import { RACEWAY_AREAS, RACEWAY_AREAS_REF, RACEWAY_ARTICLE } from '../tables/raceway-areas'
import {
  checkEdition,
  checkInputObject,
  checkKey,
  checkOneOf,
  checkSize,
  checkWholeNumber,
  collectIssues,
  inputIssue,
} from './input-checks'
import { sizeLabel } from './sizes'

const RACEWAY_KINDS = ['EMT', 'PVC40', 'PVC80', 'RMC'] as const

interface AreaTerm {
  count: number
  areaIn2: number
  insulation: Insulation
  text: string
}

/** Table 5 area of each conductor group, or issues naming the group's field. */
function areaTerms(conductors: unknown): Outcome<AreaTerm[]> {
  if (!Array.isArray(conductors) || conductors.length === 0) {
    return { ok: false, issues: [inputIssue('conductors', 'must list at least one group of conductors')] }
  }
  const issues: EngineIssue[] = []
  const terms: AreaTerm[] = []
  conductors.forEach((group: unknown, i) => {
    const field = `conductors[${i}]`
    const shape = checkInputObject(group)
    if (shape) return void issues.push({ ...shape, field })
    const g = group as Partial<ConduitConductor>
    const found = collectIssues(
      checkSize(`${field}.size`, g.size),
      checkOneOf(`${field}.insulation`, g.insulation, INSULATIONS),
      checkWholeNumber(`${field}.count`, g.count, 1),
    )
    if (found.length > 0 || !g.size || !g.insulation || !g.count) return void issues.push(...found)
    const areaIn2 = CONDUCTOR_AREAS_IN2[g.insulation][g.size]
    if (areaIn2 === undefined) {
      return void issues.push(inputIssue(`${field}.size`, `${sizeLabel(g.size)} has no "${CONDUCTOR_AREA_ROW[g.insulation]}" row in ${CONDUCTOR_AREAS_REF}`))
    }
    terms.push({ count: g.count, areaIn2, insulation: g.insulation, text: `${g.count} × ${fmt(areaIn2, 4)} in² (${sizeLabel(g.size)} ${g.insulation})` })
  })
  return issues.length > 0 ? { ok: false, issues } : { ok: true, value: terms }
}

/**
 * Smallest trade size of a raceway for a set of conductors: total conductor area (Table 5)
 * within the fill limit of Table 1 (1 conductor 53 %, 2 conductors 31 %, more 40 %) of the
 * raceway's internal area (Table 4). Count equipment grounding conductors among the conductors.
 * Sources: NFPA 70 Chapter 9 Tables 1, 4 and 5 (2017, 2020, 2023).
 */
export function conduitFill(input: ConduitFillInput): Outcome<ConduitFill> {
  const shape = checkInputObject(input)
  if (shape) return { ok: false, issues: [shape] }
  const terms = areaTerms(input.conductors)
  const issues = [
    ...collectIssues(checkKey(input.key), checkEdition(input.edition), checkOneOf('raceway', input.raceway, RACEWAY_KINDS)),
    ...(terms.ok ? [] : terms.issues),
  ]
  if (issues.length > 0 || !terms.ok) return { ok: false, issues }

  const { key, raceway } = input
  const totalIn2 = terms.value.reduce((sum, t) => sum + t.count * t.areaIn2, 0)
  const count = terms.value.reduce((sum, t) => sum + t.count, 0)
  const limitPercent = conduitFillLimitPercent(count)
  if (limitPercent === null) return { ok: false, issues: [inputIssue('conductors', `${count} is not a number of conductors`)] }
  const sizes = RACEWAY_AREAS[raceway]
  const fits = sizes.find((r) => totalIn2 <= (r.totalIn2 * limitPercent) / 100)
  if (!fits) {
    const largest = sizes[sizes.length - 1]
    return {
      ok: false,
      issues: [
        inputIssue(
          'conductors',
          `${fmt(totalIn2, 4)} in² of conductors exceeds ${limitPercent} % of the largest ${raceway} (trade size ${largest?.tradeSize}): use parallel raceways`,
        ),
      ],
    }
  }
  const fillPercent = (totalIn2 / fits.totalIn2) * 100
  const steps: Derived[] = [
    {
      key: `${key}.conductorArea`,
      label: 'Total conductor area',
      value: totalIn2,
      unit: 'in²',
      formula: `${terms.value.map((t) => t.text).join(' + ')} = ${fmt(totalIn2, 4)} in²`,
      reference: CONDUCTOR_AREAS_REF,
      status: 'info',
      message: [...new Set(terms.value.map((t) => t.insulation))].map((ins) => `${ins}: row ${CONDUCTOR_AREA_ROW[ins]}`).join('; ') + '.',
    },
    {
      key: `${key}.fillLimit`,
      label: 'Permitted fill',
      value: limitPercent,
      unit: '%',
      formula: `${count} conductor${count === 1 ? '' : 's'} → ${limitPercent} %`,
      reference: CONDUIT_FILL_REF,
      status: 'info',
      message: 'Equipment grounding conductors count toward the fill.',
    },
    {
      key: `${key}.conduitFill`,
      label: 'Raceway fill',
      value: fillPercent,
      unit: '%',
      formula: `${fmt(totalIn2, 4)} in² ÷ ${fmt(fits.totalIn2, 3)} in² (trade size ${fits.tradeSize}) × 100 = ${fmt(fillPercent, 1)} % ≤ ${limitPercent} %`,
      reference: `${RACEWAY_AREAS_REF}, ${RACEWAY_ARTICLE[raceway]}`,
      status: 'pass',
      message: `Trade size ${fits.tradeSize} ${raceway} is the smallest within the ${limitPercent} % fill limit.`,
    },
  ]
  return { ok: true, value: { tradeSize: fits.tradeSize, fillPercent, steps } }
}
