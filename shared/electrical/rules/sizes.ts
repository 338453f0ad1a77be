import { CONDUCTOR_SIZES, type ConductorSize } from '../types'

/** Position of a size in ascending order; comparisons of sizes go through this. */
export const sizeIndex = (size: ConductorSize): number => CONDUCTOR_SIZES.indexOf(size)

/** "10 AWG" or "250 kcmil". */
export function sizeLabel(size: ConductorSize): string {
  return sizeIndex(size) >= sizeIndex('250') ? `${size} kcmil` : `${size} AWG`
}

/** Drawing and schedule notation: "#10 AWG" or "250 kcmil". */
export function drawingSizeLabel(size: ConductorSize): string {
  return sizeIndex(size) >= sizeIndex('250') ? `${size} kcmil` : `#${size} AWG`
}
