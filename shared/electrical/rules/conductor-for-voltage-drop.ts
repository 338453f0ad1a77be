import type { ConductorSelection, ConductorSelectionInput, Derived, Outcome, VoltageDrop, VoltageDropInput } from '../types'
import { fmt } from '../format'
import { nextLargerSize, selectConductor } from './conductor'
import { voltageDrop } from './voltage-drop'
import { sizeLabel } from './sizes'
import { checkPositive } from './input-checks'

/** Conductor selection plus the voltage-drop data of the run. */
export interface VoltageDropSizingInput
  extends ConductorSelectionInput,
    Pick<VoltageDropInput, 'system' | 'voltageV' | 'lengthFt' | 'powerFactor' | 'limitPercent'> {
  /** Current the drop is computed at, e.g. Imp for a DC string or the inverter output current [A]. */
  dropCurrentA: number
}

export interface VoltageDropSizing {
  /** Smallest conductor by ampacity alone: the "minimum size" of 250.122(B). */
  ampacitySelection: ConductorSelection
  /** Conductor chosen: the ampacity selection, upsized until the drop is within the limit. */
  selection: ConductorSelection
  drop: VoltageDrop
  /** Every step of the chosen conductor, then the drop, then the upsizing note when upsized. */
  steps: Derived[]
}

/**
 * Selects the conductor by ampacity (selectConductor), then steps to the next larger size until
 * the voltage drop is within `limitPercent`, re-running the whole selection at each size so every
 * ampacity and protection check still holds. Sizes without a Table 9 row are skipped for AC.
 * When even 2000 kcmil exceeds the limit, the largest size is returned and the drop step warns.
 * Sources: as selectConductor and voltageDrop.
 */
export function selectConductorForVoltageDrop(input: VoltageDropSizingInput): Outcome<VoltageDropSizing> {
  const current = checkPositive('dropCurrentA', input?.dropCurrentA, 'A')
  if (current) return { ok: false, issues: [current] }
  const ampacity = selectConductor(input)
  if (!ampacity.ok) return ampacity
  const dropOf = (selection: ConductorSelection) =>
    voltageDrop({
      key: input.key,
      edition: input.edition,
      system: input.system,
      currentA: input.dropCurrentA,
      voltageV: input.voltageV,
      lengthFt: input.lengthFt,
      size: selection.size,
      material: input.material,
      parallelSets: selection.parallelSets,
      method: input.method,
      powerFactor: input.powerFactor,
      limitPercent: input.limitPercent,
    })

  let selection = ampacity.value
  let drop = dropOf(selection)
  // AC sizes Table 9 does not print (700–900 kcmil, above 1000 kcmil) are skipped
  for (
    let size = nextLargerSize(selection.size, input.material);
    size && (!drop.ok || drop.value.dropPercent > input.limitPercent);
    size = nextLargerSize(size, input.material)
  ) {
    const larger = selectConductor({ ...input, minimumSize: size })
    if (!larger.ok) break
    const largerDrop = dropOf(larger.value)
    if (!largerDrop.ok) continue
    selection = larger.value
    drop = largerDrop
  }
  if (!drop.ok) return drop

  const steps = [...selection.steps, ...drop.value.steps]
  if (selection.size !== ampacity.value.size || selection.parallelSets !== ampacity.value.parallelSets) {
    const from = `${ampacity.value.parallelSets > 1 ? `${ampacity.value.parallelSets} × ` : ''}${sizeLabel(ampacity.value.size)}`
    const to = `${selection.parallelSets > 1 ? `${selection.parallelSets} × ` : ''}${sizeLabel(selection.size)}`
    steps.push({
      key: `${input.key}.voltageDropUpsize`,
      label: 'Upsized for voltage drop',
      value: drop.value.dropPercent,
      unit: '%',
      formula: `${from} → ${to}: ${fmt(drop.value.dropPercent)} % ${drop.value.dropPercent <= input.limitPercent ? '≤' : '>'} ${fmt(input.limitPercent)} %`,
      reference: '',
      status: drop.value.dropPercent <= input.limitPercent ? 'info' : 'warn',
      message: `Upsized from ${from} ${input.material} (smallest by ampacity) for voltage drop; size the EGC with both sizes (250.122(B), or 690.45 for PV circuits).`,
    })
  }
  return { ok: true, value: { ampacitySelection: ampacity.value, selection, drop: drop.value, steps } }
}
