import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import Handlebars from 'handlebars'
import { SAFETY_CAUTION } from '../../shared/electrical/caution'
import { NOTIFICATION_CATEGORIES, NOTIFICATION_CATEGORY_INFO, type NotificationCategory } from '../../shared/schemas/notifications'

const MAIL_TEMPLATES_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../templates/mail')

/** What every mail knows about its reader, for the greeting and the footer. */
export interface MailReader {
  recipientName: string
  recipientEmail: string
  settingsUrl: string
}

export interface RenderedMail {
  subject: string
  text: string
  html: string
}

interface CategoryTemplates {
  subject: HandlebarsTemplateDelegate
  text: HandlebarsTemplateDelegate
  html: HandlebarsTemplateDelegate
}

/**
 * The mail templates of templates/mail: per category a subject, a text and an HTML template; the
 * partials carry the layout and the footer with the safety caution and how to switch the category
 * off. HTML output is escaped by handlebars (the templates never use triple braces); subject and
 * text are plain text and not escaped.
 */
export class MailTemplates {
  private readonly byCategory: Record<NotificationCategory, CategoryTemplates>

  constructor(dir = MAIL_TEMPLATES_DIR) {
    const plain = Handlebars.create()
    const html = Handlebars.create()
    const read = (file: string) => readFileSync(path.join(dir, file), 'utf8')
    for (const file of readdirSync(path.join(dir, 'partials'))) {
      const name = file.replace(/\.hbs$/, '')
      const target = name.startsWith('html-') ? html : plain
      target.registerPartial(name, read(path.join('partials', file)))
    }
    const compile = (file: string, engine: typeof Handlebars, noEscape: boolean) => engine.compile(read(file), { strict: true, noEscape })
    this.byCategory = Object.fromEntries(
      NOTIFICATION_CATEGORIES.map((category) => [
        category,
        {
          subject: compile(`${category}.subject.hbs`, plain, true),
          text: compile(`${category}.text.hbs`, plain, true),
          html: compile(`${category}.html.hbs`, html, false),
        },
      ]),
    ) as Record<NotificationCategory, CategoryTemplates>
  }

  render(category: NotificationCategory, data: MailReader & Record<string, unknown>): RenderedMail {
    const templates = this.byCategory[category]
    // one line: a header must not carry a line break from a project name
    const subject = templates.subject(data).replace(/\s+/g, ' ').trim()
    const context = { ...data, subject, caution: SAFETY_CAUTION, categoryLabel: NOTIFICATION_CATEGORY_INFO[category].label }
    return { subject, text: templates.text(context), html: templates.html(context) }
  }
}
