import type { SectionByEdition } from '../reference'
import type { NecEdition } from '../types'

/**
 * Field-applied labels and placards a PV system may need, with the wording the code asks for.
 * Source: NFPA 70 (NEC) 2017, 2020 and 2023 editions, Articles 110, 690, 705, 706 and 710
 * (section numbers and wording from memory: verify against the adopted edition). Braced names such
 * as `{maxVoltage}` are filled from the evaluation by `rules/labels.ts`; blank lines (`____`) are
 * filled in the field by the installer. Sizes are common practice, no source: the code sets letter
 * heights only for the rapid-shutdown labels.
 */

/** ANSI Z535.4 signal words; the code asks for one where the hazard marking must warn (110.21(B)(1)). */
export type SignalWord = 'DANGER' | 'WARNING' | 'CAUTION'

export const LABEL_KIND_IDS = [
  'rapidShutdownSystem',
  'rapidShutdownSwitch',
  'pvSystemDisconnect',
  'lineLoadEnergized',
  'dcMaxVoltage',
  'dcConductorMarking',
  'powerSourceOutput',
  'multipleSources',
  'backfedBreakerFixed',
  'busbarSumRule',
  'supplySideDisconnect',
  'sourceDirectory',
  'essDisconnect',
  'standAloneSystem',
] as const
export type LabelKindId = (typeof LABEL_KIND_IDS)[number]

export interface LabelKind {
  id: LabelKindId
  signalWord: SignalWord | null
  /** Bold first line of the label, when the code gives the label a title. */
  title: string | null
  /** Body wording, per edition where it changed. */
  text: string | Record<NecEdition, string>
  /** Where the code puts it, in general words; the rule adds the design's equipment. */
  placement: string
  reference: SectionByEdition
  /** Printed size [in]; common practice, no source, unless `letterHeightIn` says otherwise. */
  sizeIn: { width: number; height: number }
  /** Minimum letter (capital) heights the code sets [in]. */
  letterHeightIn?: { title: number; text: number }
  /** Colours or stock the code sets, printed beside the size. */
  stock?: string
  /** Wording the code leaves to the installer ("or equivalent"): ours, common practice, no source. */
  wordingOurs?: boolean
}

export const REQUIRED_LABELS: Record<LabelKindId, LabelKind> = {
  // 690.56(C): 2017 690.56(C)(1)(a); 2020 and 2023 690.56(C)(1). Title ≥ 3/8 in, other text ≥ 3/16 in,
  // capitals, black on yellow (reflective). Values from memory.
  rapidShutdownSystem: {
    id: 'rapidShutdownSystem', signalWord: null,
    title: 'SOLAR PV SYSTEM EQUIPPED WITH RAPID SHUTDOWN',
    text: 'TURN RAPID SHUTDOWN SWITCH TO THE "OFF" POSITION TO SHUT DOWN PV SYSTEM AND REDUCE SHOCK HAZARD IN THE ARRAY.',
    placement: 'At each service equipment location to which the PV system is connected, or at an approved readily visible location',
    reference: { 2017: '690.56(C)(1)(a)', 2020: '690.56(C)(1)', 2023: '690.56(C)(1)' },
    sizeIn: { width: 5.5, height: 4 }, letterHeightIn: { title: 0.375, text: 0.1875 },
    stock: 'black capitals on yellow, reflective',
  },
  // 2017 690.56(C)(3); 2020 and 2023 690.56(C)(2): letters ≥ 3/8 in, white on red, reflective. From memory.
  rapidShutdownSwitch: {
    id: 'rapidShutdownSwitch', signalWord: null, title: 'RAPID SHUTDOWN SWITCH FOR SOLAR PV SYSTEM', text: '',
    placement: 'On or within 3 ft of the rapid shutdown initiation device',
    reference: { 2017: '690.56(C)(3)', 2020: '690.56(C)(2)', 2023: '690.56(C)(2)' },
    sizeIn: { width: 5.5, height: 2.5 }, letterHeightIn: { title: 0.375, text: 0.375 },
    stock: 'white capitals on red, reflective',
  },
  // 690.13(B): "PV SYSTEM DISCONNECT" or equivalent (all three editions, from memory).
  pvSystemDisconnect: {
    id: 'pvSystemDisconnect', signalWord: null, title: 'PV SYSTEM DISCONNECT', text: '{current} DISCONNECT FOR {equipment}',
    placement: 'On each PV system disconnecting means', reference: '690.13(B)', sizeIn: { width: 3.5, height: 1.5 },
  },
  // 690.13(B): where line and load terminals may be energized in the open position (from memory).
  lineLoadEnergized: {
    id: 'lineLoadEnergized', signalWord: 'WARNING', title: 'ELECTRIC SHOCK HAZARD',
    text: 'TERMINALS ON THE LINE AND LOAD SIDES MAY BE ENERGIZED IN THE OPEN POSITION.',
    placement: 'On each disconnecting means with sources on both sides', reference: '690.13(B)', sizeIn: { width: 3.5, height: 2 },
  },
  // 690.53: 2017 asked for voltage and current at the DC disconnect; 2020 and 2023 the highest
  // maximum DC voltage only, at the DC disconnect, the conversion equipment or distribution equipment. From memory.
  dcMaxVoltage: {
    id: 'dcMaxVoltage', signalWord: 'WARNING', title: 'PHOTOVOLTAIC POWER SOURCE',
    text: {
      2017: 'MAXIMUM DC VOLTAGE: {maxVoltage}. MAXIMUM CIRCUIT CURRENT: {maxCurrent}.',
      2020: 'MAXIMUM DC VOLTAGE OF PV SYSTEM: {maxVoltage}.',
      2023: 'MAXIMUM DC VOLTAGE OF PV SYSTEM: {maxVoltage}.',
    },
    placement: 'At the DC PV system disconnecting means or the PV power conversion equipment',
    reference: '690.53', sizeIn: { width: 3.5, height: 2 },
  },
  // 2017 690.31(G)(3)-(4); 2020 and 2023 690.31(D)(2): every 10 ft, at turns, above and below
  // penetrations, on raceways, enclosures and cable assemblies of PV DC circuits on or in buildings. From memory.
  dcConductorMarking: {
    id: 'dcConductorMarking', signalWord: 'WARNING',
    title: null,
    text: { 2017: 'PHOTOVOLTAIC POWER SOURCE', 2020: 'SOLAR PV DC CIRCUIT', 2023: 'SOLAR PV DC CIRCUIT' },
    placement: 'On raceways, enclosures and cable assemblies of PV DC circuits: at most every 10 ft, at turns, above and below penetrations',
    reference: { 2017: '690.31(G)(3) and (G)(4)', 2020: '690.31(D)(2)', 2023: '690.31(D)(2)' },
    sizeIn: { width: 3.5, height: 1.25 },
  },
  // 690.54: the point of interconnection marked as a power source with rated AC output current and
  // nominal operating AC voltage (numbering in 2023 from memory, verify).
  powerSourceOutput: {
    id: 'powerSourceOutput', signalWord: null, title: 'PV SYSTEM POWER SOURCE',
    text: 'RATED AC OUTPUT CURRENT: {ratedCurrent}. NOMINAL OPERATING AC VOLTAGE: {nominalVoltage}.',
    placement: 'At the disconnecting means of the interactive system\u2019s point of interconnection',
    reference: '690.54', sizeIn: { width: 3.5, height: 2 },
  },
  // 2017 705.12(B)(3); 2020 and 2023 705.12(C): equipment fed by several sources marked to show them all. From memory.
  multipleSources: {
    id: 'multipleSources', signalWord: 'WARNING', title: 'DUAL POWER SOURCES',
    text: 'THIS EQUIPMENT IS FED BY THE UTILITY AND BY A PV SYSTEM{storage}.',
    placement: 'On distribution equipment supplied by more than one source', wordingOurs: true,
    reference: { 2017: '705.12(B)(3)', 2020: '705.12(C)', 2023: '705.12(C)' }, sizeIn: { width: 3.5, height: 2 },
  },
  // 120 % allowance: 2017 705.12(B)(2)(3)(b); 2020 and 2023 705.12(B)(3)(2). From memory.
  backfedBreakerFixed: {
    id: 'backfedBreakerFixed', signalWord: 'WARNING', title: 'POWER SOURCE OUTPUT CONNECTION',
    text: 'DO NOT RELOCATE THIS OVERCURRENT DEVICE.',
    placement: 'On the distribution equipment, adjacent to the back-fed breaker from the power source',
    reference: { 2017: '705.12(B)(2)(3)(b)', 2020: '705.12(B)(3)(2)', 2023: '705.12(B)(3)(2)' }, sizeIn: { width: 3.5, height: 1.5 },
  },
  // Sum-of-breakers allowance: 2017 705.12(B)(2)(3)(c); 2020 and 2023 705.12(B)(3)(3). From memory.
  busbarSumRule: {
    id: 'busbarSumRule', signalWord: 'WARNING', title: 'THIS EQUIPMENT FED BY MULTIPLE SOURCES',
    text: 'TOTAL RATING OF ALL OVERCURRENT DEVICES, EXCLUDING MAIN SUPPLY OVERCURRENT DEVICE, SHALL NOT EXCEED AMPACITY OF BUSBAR.',
    placement: 'On the distribution equipment whose busbar is sized by the sum rule',
    reference: { 2017: '705.12(B)(2)(3)(c)', 2020: '705.12(B)(3)(3)', 2023: '705.12(B)(3)(3)' }, sizeIn: { width: 3.5, height: 2 },
  },
  // Supply-side connection: 2017 705.12(A); 2020 and 2023 705.11. The code asks for the disconnect to be
  // identified as the power-source disconnect; the wording is ours. From memory.
  supplySideDisconnect: {
    id: 'supplySideDisconnect', signalWord: 'WARNING', title: 'SUPPLY-SIDE POWER SOURCE CONNECTION',
    text: 'PV SYSTEM CONNECTED ON THE SUPPLY SIDE OF THE SERVICE DISCONNECT AT {point}. OPENING THE SERVICE DISCONNECT DOES NOT DE-ENERGIZE THE PV SYSTEM CONDUCTORS.',
    placement: 'On the power source disconnecting means of the supply-side connection and at the service equipment', wordingOurs: true,
    reference: { 2017: '705.12(A)', 2020: '705.11', 2023: '705.11' }, sizeIn: { width: 3.5, height: 2.5 },
  },
  // 705.10 (2017 "Directory", 2020 and 2023 "Identification of Power Sources"); 706.21 sends ESS here
  // in 2020 and 2023. Plaque or directory of every power source disconnect. From memory.
  sourceDirectory: {
    id: 'sourceDirectory', signalWord: 'CAUTION', title: 'MULTIPLE SOURCES OF POWER',
    text: 'THIS PREMISES IS SUPPLIED BY THE UTILITY SERVICE AND BY: {sources}.',
    placement: 'At each service equipment location and at each power production source location',
    reference: '705.10', sizeIn: { width: 5, height: 3 },
  },
  // ESS disconnect marking: 2017 706.7(D); 2020 and 2023 706.15(C). From memory.
  essDisconnect: {
    id: 'essDisconnect', signalWord: 'WARNING', title: 'ENERGY STORAGE SYSTEM DISCONNECT',
    text: 'NOMINAL ESS VOLTAGE: {nominalVoltage}. MAXIMUM AVAILABLE SHORT-CIRCUIT CURRENT: ________ A. CLEARING TIME: ________ s. DATE OF CALCULATION: ________.',
    placement: 'On the ESS disconnecting means', reference: { 2017: '706.7(D)', 2020: '706.15(C)', 2023: '706.15(C)' },
    sizeIn: { width: 3.5, height: 2.5 },
  },
  // Stand-alone system: 2017 690.56(A); 2020 and 2023 710.10. From memory.
  standAloneSystem: {
    id: 'standAloneSystem', signalWord: 'CAUTION', title: 'STAND-ALONE ELECTRICAL POWER SYSTEM',
    text: 'THIS STRUCTURE IS SUPPLIED BY A STAND-ALONE PV SYSTEM WITH NO UTILITY SERVICE. SYSTEM DISCONNECTING MEANS: {sources}.',
    placement: 'On the exterior of the building or structure at a readily visible location acceptable to the AHJ',
    reference: { 2017: '690.56(A)', 2020: '710.10', 2023: '710.10' }, sizeIn: { width: 5, height: 3 },
  },
}

/**
 * Field-applied hazard markings: signal word, colours and symbols as ANSI Z535.4 suggests; permanent,
 * not hand-written, and suitable for the environment (110.21(B)(1)-(3), 2017, 2020 and 2023; from memory).
 */
export const LABEL_MATERIAL_NOTE = {
  reference: '110.21(B)',
  text:
    'Labels are field-applied hazard markings: permanently affixed (riveted or adhesive rated for the surface), not hand-written ' +
    'except for values to be filled in the field, UV- and weather-resistant where outdoors, of sufficient durability for the ' +
    'environment, with signal word, colours and symbols following ANSI Z535.4. Reflective material where the code asks for it ' +
    '(rapid shutdown labels). Confirm material, colour and any additional labels with the AHJ and the utility.',
} as const
