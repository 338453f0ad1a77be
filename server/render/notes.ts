/** General notes text from the handlebars templates in `templates/` (plain text, one note a line). */
import Handlebars from 'handlebars'
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'

const TEMPLATES_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../templates')
const compiled = new Map<string, HandlebarsTemplateDelegate>()

/** The notes of a template, filled in; empty lines dropped. Sheets escape or sanitise the text themselves. */
export function notesFromTemplate(name: string, data: Record<string, unknown>): string[] {
  let template = compiled.get(name)
  if (!template) {
    template = Handlebars.compile(readFileSync(path.join(TEMPLATES_DIR, `${name}.hbs`), 'utf8'), { noEscape: true, strict: true })
    compiled.set(name, template)
  }
  return template(data).split('\n').map((l) => l.trim()).filter((l) => l !== '')
}
