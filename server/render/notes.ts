/** General notes text from the handlebars templates in `templates/` (plain text, one note a line), and the numbered note block the sheets print it in. */
import Handlebars from 'handlebars'
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { text, wrap } from './fonts'
import type { Box, DrawItem } from './model'

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

export interface NoteStyle { size: number; /** number the notes 1., 2., … */ numbered: boolean }

const LEADING = 1.3
const HEADING_HEIGHT = 12

const noteLines = (notes: readonly string[], width: number, style: NoteStyle) =>
  notes.map((note, k) => wrap(style.numbered ? `${k + 1}. ${note}` : note, style.size, 'regular', width))

/** Height of a titled block of notes at a width [pt]. */
export const notesHeight = (notes: readonly string[], width: number, style: NoteStyle): number =>
  HEADING_HEIGHT + noteLines(notes, width, style).reduce((t, lines) => t + lines.length * style.size * LEADING + style.size * 0.4, 0)

/** A titled block of wrapped notes from the top of `box`; the box's height is not enforced, size it with `notesHeight`. */
export function notesBlock(title: string, notes: readonly string[], box: Box, style: NoteStyle): DrawItem[] {
  const items: DrawItem[] = [text(title.toUpperCase(), box.x, box.y + 8, { size: style.size + 0.5, weight: 'bold' }, box.width)]
  let y = box.y + HEADING_HEIGHT - style.size * 0.3
  for (const lines of noteLines(notes, box.width, style)) {
    for (const line of lines) {
      y += style.size * LEADING
      items.push(text(line, box.x, y, { size: style.size }))
    }
    y += style.size * 0.4
  }
  return [{ kind: 'group', role: 'note', data: {}, items }]
}
