import Handlebars from 'handlebars'
import { z } from 'zod'
import { NEC_EDITIONS } from '../electrical/types'
import { codeBasisSchema } from './design'
import { pageQuery } from './paging'

/** Request and response shapes of jurisdiction profiles, shared by client and server. */

/** Sheet sizes a plan set can be drawn on; ANSI B (11 × 17 in) unless the AHJ asks otherwise. */
export const SHEET_SIZES = ['ANSI_B', 'ANSI_D', 'A3'] as const
export type SheetSize = (typeof SHEET_SIZES)[number]

export const SUBMISSION_METHODS = ['portal', 'email', 'counter'] as const
export type SubmissionMethod = (typeof SUBMISSION_METHODS)[number]

/**
 * Fields the general-notes template may use, e.g. `{{project.code}}`. Only `{{#if}}` and
 * `{{#unless}}` blocks are allowed besides them, so a template can never call into anything else.
 */
export const GENERAL_NOTE_FIELDS = [
  'project.code',
  'project.name',
  'project.customerName',
  'project.siteAddress',
  'project.siteCity',
  'project.utility',
  'project.systemKind',
  'jurisdiction.name',
  'jurisdiction.necEdition',
] as const
const NOTE_BLOCK_HELPERS = ['if', 'unless']

/** Names every problem of a general-notes template: syntax, unknown fields, partials. */
export function generalNotesTemplateProblems(template: string): string[] {
  let program: hbs.AST.Program
  try {
    program = Handlebars.parse(template)
  } catch (err) {
    return [`is not a valid template: ${(err as Error).message.split('\n')[0]}`]
  }
  const problems: string[] = []
  const allowed = new Set<string>([...GENERAL_NOTE_FIELDS, ...NOTE_BLOCK_HELPERS])
  class FieldCheck extends Handlebars.Visitor {
    override PathExpression(path: hbs.AST.PathExpression) {
      if (!allowed.has(path.original)) problems.push(`uses unknown field "${path.original}"; use one of ${GENERAL_NOTE_FIELDS.join(', ')}`)
    }
    override PartialStatement() {
      problems.push('may not include partials')
    }
    override PartialBlockStatement() {
      problems.push('may not include partials')
    }
  }
  new FieldCheck().accept(program)
  return [...new Set(problems)]
}

const text = (max: number) => z.string().trim().min(1, 'must not be empty').max(max)
const nullableText = (max: number) => z.string().trim().max(max).nullable()

/** NEC section a label is required by, e.g. `690.56(C)` or `705.12(C)`. */
const labelReference = z
  .string()
  .trim()
  .regex(/^\d{3}\.\d{1,3}(\([A-Za-z0-9]{1,4}\))*$/, 'must be an NEC section such as 690.56(C)')

const jurisdictionFields = z.object({
  name: text(160),
  necEdition: z.literal(NEC_EDITIONS),
  /** Same bounds as the design document's code basis [°C]. */
  designLowC: codeBasisSchema.shape.designLowC,
  designHighC: codeBasisSchema.shape.designHighC,
  sheetSize: z.enum(SHEET_SIZES),
  /** Labels this AHJ requires on every job, by the section that calls for them. */
  requiredLabels: z.array(labelReference).max(60),
  /** Extra general notes printed on the cover sheet: a template over GENERAL_NOTE_FIELDS. */
  generalNotesTemplate: z.string().max(20_000),
  submissionMethod: z.enum(SUBMISSION_METHODS),
  submissionContact: nullableText(160),
  submissionEmail: z.email({ message: 'must be an e-mail address' }).max(254).nullable(),
  submissionPhone: z.string().trim().regex(/^[0-9+()./ -]{5,40}$/, 'must be a phone number').nullable(),
  submissionUrl: z.url({ protocol: /^https?$/, message: 'must be an http(s) address' }).max(500).nullable(),
  /** Counter submissions: where to bring the set. */
  submissionAddress: nullableText(300),
  feeNotes: z.string().max(5000),
})
type JurisdictionFields = z.infer<typeof jurisdictionFields>

/**
 * Rules between fields; each problem names its field. They run even when another field is
 * malformed, so one answer names every problem; a field that is missing or of the wrong type is
 * left to its own check.
 */
function checkJurisdiction(value: unknown, ctx: z.RefinementCtx) {
  const p = value as Partial<Record<keyof JurisdictionFields, unknown>>
  const problem = (field: keyof JurisdictionFields, message: string) => ctx.addIssue({ code: 'custom', path: [field], message })
  if (typeof p.designLowC === 'number' && typeof p.designHighC === 'number' && p.designLowC >= p.designHighC) {
    problem('designLowC', 'must be below designHighC')
  }
  if (Array.isArray(p.requiredLabels) && new Set(p.requiredLabels).size !== p.requiredLabels.length) {
    problem('requiredLabels', 'lists a section twice')
  }
  if (typeof p.generalNotesTemplate === 'string') {
    for (const message of generalNotesTemplateProblems(p.generalNotesTemplate)) problem('generalNotesTemplate', message)
  }
  const required = { portal: 'submissionUrl', email: 'submissionEmail', counter: 'submissionAddress' } as const
  const method = p.submissionMethod
  if (method === 'portal' || method === 'email' || method === 'counter') {
    const field = required[method]
    if (p[field] === null) problem(field, `is required for ${method} submissions`)
  }
}
const everyObject = { when: (payload: { value: unknown }) => typeof payload.value === 'object' && payload.value !== null }

export const createJurisdictionBody = jurisdictionFields
  .extend({
    sheetSize: jurisdictionFields.shape.sheetSize.default('ANSI_B'),
    requiredLabels: jurisdictionFields.shape.requiredLabels.default([]),
    generalNotesTemplate: jurisdictionFields.shape.generalNotesTemplate.default(''),
    submissionContact: jurisdictionFields.shape.submissionContact.default(null),
    submissionEmail: jurisdictionFields.shape.submissionEmail.default(null),
    submissionPhone: jurisdictionFields.shape.submissionPhone.default(null),
    submissionUrl: jurisdictionFields.shape.submissionUrl.default(null),
    submissionAddress: jurisdictionFields.shape.submissionAddress.default(null),
    feeNotes: jurisdictionFields.shape.feeNotes.default(''),
  })
  .strict()
  .superRefine(checkJurisdiction, everyObject)
export type CreateJurisdictionBody = z.infer<typeof createJurisdictionBody>

/**
 * A change: any fields plus the version read. Rules that span fields are checked again by the
 * server on the merged profile, since a partial change can break them.
 */
export const updateJurisdictionBody = jurisdictionFields
  .partial()
  .extend({ version: z.number().int().min(1) })
  .strict()
  .superRefine(checkJurisdiction, everyObject)
export type UpdateJurisdictionBody = z.infer<typeof updateJurisdictionBody>

/** The whole profile after a change, for the cross-field rules. */
export const jurisdictionProfileSchema = jurisdictionFields.superRefine(checkJurisdiction, everyObject)

export const JURISDICTION_SORTS = ['name', '-name', 'necEdition', '-necEdition', 'updatedAt', '-updatedAt'] as const
export const jurisdictionListQuery = pageQuery(JURISDICTION_SORTS).extend({
  necEdition: z.coerce.number().pipe(z.literal(NEC_EDITIONS)).optional(),
})
export type JurisdictionListQuery = z.infer<typeof jurisdictionListQuery>

/** A profile as the API answers it. */
export const jurisdictionDto = jurisdictionFields.extend({
  id: z.uuid(),
  /** Projects that name this profile (a profile in use cannot be deleted). */
  projectCount: z.number().int(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
  version: z.number().int(),
})
export type JurisdictionDto = z.infer<typeof jurisdictionDto>

/** The values a general-notes template is filled with. */
export interface GeneralNotesContext {
  project: { code: string; name: string; customerName: string; siteAddress: string; siteCity: string; utility: string | null; systemKind: string }
  jurisdiction: { name: string; necEdition: number }
}

/** Fills a template checked by `generalNotesTemplateProblems`; plain text out (no HTML escaping: it goes on a PDF). */
export function renderGeneralNotes(template: string, context: GeneralNotesContext): string {
  return Handlebars.compile(template, { noEscape: true, strict: false, knownHelpersOnly: true, knownHelpers: { if: true, unless: true } })(context).trim()
}
