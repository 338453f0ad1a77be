/** A current band of Table 450.3(B): from `fromA` rated amperes up, `percent` of rated current. */
export type TransformerOcpdBand = { fromA: number; percent: number; nextHigherPermitted: boolean }

/**
 * Table 450.3(B), transformers of 1000 V and less: the largest overcurrent
 * device, as a percentage of the winding's rated current. Source: NFPA 70 Table 450.3(B), 2017,
 * 2020 and 2023 editions (values from memory). Note 1: where 125 % does not match a standard
 * rating the next higher standard rating is permitted.
 */
export const TABLE_450_3_B = {
  /** Primary protection only. */
  primaryOnly: [
    { fromA: 9, percent: 125, nextHigherPermitted: true },
    { fromA: 2, percent: 167, nextHigherPermitted: false },
    { fromA: 0, percent: 300, nextHigherPermitted: false },
  ],
  /** Primary and secondary protection: the primary device may be up to 250 %. */
  primaryWithSecondary: 250,
  secondary: [
    { fromA: 9, percent: 125, nextHigherPermitted: true },
    { fromA: 0, percent: 167, nextHigherPermitted: false },
  ],
} as const

/** Voltage limit of Table 450.3(B) [V]: 1000 V and less in 2017, 2020 and 2023 (from memory; 600 V before 2014). */
export const TABLE_450_3_B_LIMIT_V = 1000
