/**
 * The submission package of one revision: the plan set, the single-line diagram, the calculations
 * as CSV and JSON, the label sheet, the design snapshot and a manifest with a SHA-256 per file,
 * zipped in PACKAGE_FILE_NAMES order as `<project-code>_rev<NN>.zip`.
 */
import { PACKAGE_FILE_NAMES, PACKAGE_STEPS, type PackageStep } from '../../shared/schemas/revision'
import { planSetContext, sheetToSvg } from '../render'
import { labelsPdf } from '../render/labels-pdf'
import { planSetPdf, type PlanSetInput, type StampBox } from '../render/plan-set'
import { calculationsCsv } from './calculations-csv'
import { buildManifest, sha256Hex, type PackageManifest } from './manifest'
import { stackSvgParts } from './single-line-file'
import { zipEntries } from './zip'

export type PackageFileName = (typeof PACKAGE_FILE_NAMES)[number]

export interface PackageInput extends PlanSetInput {
  revision: number
  /** One line for the revision table, e.g. "Issued for permit". */
  description: string
  created: Date
  /** Stringline release (package.json version). */
  productVersion: string
}

export interface BuiltFile { name: PackageFileName; bytes: Buffer; sha256: string; mediaType: string }

export interface BuiltPackage {
  zip: Buffer
  /** `<project-code>_rev<NN>.zip`. */
  fileName: string
  manifest: PackageManifest
  /** In packing order, manifest.json last. */
  files: BuiltFile[]
  sheetCount: number
  /** Where each sheet's stamp box is in plan-set.pdf. */
  stampBoxes: StampBox[]
}

const MEDIA_TYPES: Record<PackageFileName, string> = {
  'plan-set.pdf': 'application/pdf',
  'single-line.svg': 'image/svg+xml',
  'calculations.csv': 'text/csv',
  'calculations.json': 'application/json',
  'labels.pdf': 'application/pdf',
  'design.json': 'application/json',
  'manifest.json': 'application/json',
}

export const packageFileName = (projectCode: string, revision: number): string => `${projectCode}_rev${String(revision).padStart(2, '0')}.zip`

/** A JSON file of the package: two-space indented, ending in a newline. */
export const jsonFile = (value: unknown) => Buffer.from(`${JSON.stringify(value, null, 2)}\n`, 'utf8')

/** Steps reported forward only: a step the plan set already reported (e.g. attachments) is not repeated. */
function forwardOnly(onStep?: (step: PackageStep) => void): (step: PackageStep) => void {
  let reached = -1
  return (step) => {
    const at = PACKAGE_STEPS.indexOf(step)
    if (at <= reached) return
    reached = at
    onStep?.(step)
  }
}

export async function buildPackage(input: PackageInput, onStep?: (step: PackageStep) => void): Promise<BuiltPackage> {
  if (!Number.isInteger(input.revision) || input.revision < 0) throw new RangeError('revision: must be a whole number from 0')
  if (Number.isNaN(input.created.getTime())) throw new RangeError('created: must be a valid date')
  const report = forwardOnly(onStep)
  const { doc, evaluation } = input

  report('drawing')
  const planSet = await planSetPdf(input, report)
  // the E-601 parts the plan set has just laid out, drawn again as SVG rather than laid out twice
  const diagramParts = planSet.sheets.filter((sheet) => sheet.id.startsWith('E-601')).map(sheetToSvg)
  const singleLine = stackSvgParts(diagramParts, `${doc.project.name} \u2014 single-line diagram, revision ${input.revision}`)
  report('attachments')
  report('labels')
  const labels = await labelsPdf(planSetContext(doc, input), evaluation)
  report('packing')

  const contents: Record<Exclude<PackageFileName, 'manifest.json'>, Buffer> = {
    'plan-set.pdf': Buffer.from(planSet.pdf),
    'single-line.svg': Buffer.from(singleLine, 'utf8'),
    'calculations.csv': Buffer.from(calculationsCsv(evaluation), 'utf8'),
    'calculations.json': jsonFile(evaluation),
    'labels.pdf': Buffer.from(labels),
    'design.json': jsonFile(doc),
  }
  const listed = PACKAGE_FILE_NAMES.filter((n) => n !== 'manifest.json').map((name) => ({ name, bytes: contents[name as keyof typeof contents], mediaType: MEDIA_TYPES[name] }))
  const manifest = buildManifest({
    productVersion: input.productVersion, engineVersion: evaluation.engineVersion, project: doc.project,
    revision: input.revision, description: input.description, created: input.created, files: listed,
  })
  const files: BuiltFile[] = [...listed, { name: 'manifest.json' as const, bytes: jsonFile(manifest), mediaType: MEDIA_TYPES['manifest.json'] }]
    .map((f) => ({ ...f, sha256: sha256Hex(f.bytes) }))
  const zip = await zipEntries(files, input.created)
  return { zip, fileName: packageFileName(doc.project.code, input.revision), manifest, files, sheetCount: planSet.sheets.length, stampBoxes: planSet.stampBoxes }
}
