import type { SectionByEdition } from '../reference'

/**
 * Temperature adder for raceways and cables exposed to direct sunlight on or above rooftops.
 * Source: NFPA 70-2017 310.15(B)(3)(c); NFPA 70-2020 and 2023 310.15(B)(2) (values from memory).
 * In these editions the former distance table (2011/2014 Table 310.15(B)(3)(c)) is gone: a single
 * 33 °C (60 °F) adder applies where the bottom of the raceway or cable is less than 7/8 in (22 mm,
 * printed as 23 mm in 2017) above the roof. Exception: Type XHHW-2 conductors are not subject to
 * the adder.
 */
export const ROOFTOP_ADDER_REF: SectionByEdition = {
  2017: '310.15(B)(3)(c)',
  2020: '310.15(B)(2)',
  2023: '310.15(B)(2)',
}

/** Distance above the roof below which the adder applies [in]. */
export const ROOFTOP_ADDER_MAX_HEIGHT_IN = 7 / 8

/** Temperature added to the outdoor ambient [°C] (60 °F). */
export const ROOFTOP_ADDER_C = 33

/** Insulation exempt from the adder by the section's exception. */
export const ROOFTOP_ADDER_EXEMPT_INSULATION = 'XHHW-2'
