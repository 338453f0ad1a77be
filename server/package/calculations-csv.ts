/**
 * `calculations.csv` of the package: every derivation of the evaluation as one row, so a reviewer
 * can sort and filter the steps printed on E-602. Input problems come first, after the caution.
 */
import Papa from 'papaparse'
import { SAFETY_CAUTION, type Evaluation } from '../../shared/electrical'

export const CALCULATION_CSV_COLUMNS = ['section', 'key', 'step', 'formula', 'value', 'unit', 'reference', 'status', 'message'] as const
type Row = Record<(typeof CALCULATION_CSV_COLUMNS)[number], string | number>

/**
 * The evaluation as CSV (RFC 4180, CRLF line ends). Text that a spreadsheet would run as a
 * formula gets a leading apostrophe (papaparse `escapeFormulae`, the same guard the equipment CSV uses).
 */
export function calculationsCsv(evaluation: Evaluation): string {
  const rows: Row[] = [
    { section: 'Caution', key: '', step: '', formula: '', value: '', unit: '', reference: '', status: 'info', message: SAFETY_CAUTION },
    ...evaluation.issues.map((i): Row => ({
      section: 'Problems with the design input', key: i.field, step: i.field, formula: '', value: '', unit: '', reference: '',
      status: i.severity === 'error' ? 'fail' : 'warn', message: i.message,
    })),
    ...evaluation.sections.flatMap((section) => section.items.map((d): Row => ({
      section: section.title, key: d.key, step: d.label, formula: d.formula,
      // numbers stay numbers (full precision, never apostrophed); booleans print as yes / no
      value: typeof d.value === 'boolean' ? (d.value ? 'yes' : 'no') : d.value,
      // '-' is the engine's mark for dimensionless; a blank cell says the same in a spreadsheet
      unit: d.unit === '-' ? '' : d.unit, reference: d.reference, status: d.status, message: d.message,
    }))),
  ]
  return Papa.unparse({ fields: [...CALCULATION_CSV_COLUMNS], data: rows.map((r) => CALCULATION_CSV_COLUMNS.map((c) => r[c])) }, { escapeFormulae: true, newline: '\r\n' })
}
