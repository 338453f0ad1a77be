/**
 * The caution every calculation view, sheet and export carries. Stringline never claims code
 * compliance on its own authority.
 */
export const SAFETY_CAUTION =
  'CAUTION: These results are design aids only. Verify every value against the code edition ' +
  'adopted by the authority having jurisdiction and its local amendments, the equipment ' +
  'manufacturers\u2019 instructions and utility requirements. Installation must be reviewed and ' +
  'approved by a licensed electrical professional and the AHJ. Electrical work can cause injury or death.'
