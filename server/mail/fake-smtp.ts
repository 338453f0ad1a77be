import { randomBytes } from 'node:crypto'
import { mkdirSync, readdirSync, readFileSync } from 'node:fs'
import { rename, writeFile } from 'node:fs/promises'
import type { AddressInfo } from 'node:net'
import path from 'node:path'
import { SMTPServer } from 'smtp-server'
import type { CaughtMailDto, CaughtMailSummaryDto } from '../../shared/schemas/notifications'

/** The header the mailer sets so the catcher (and mail filters) can tell the category. */
export const CATEGORY_HEADER = 'X-Stringline-Category'

/** One message as the catcher stores it: the SMTP envelope, the raw message and what could be read of it. */
export interface CaughtMail extends CaughtMailDto {
  envelope: { from: string; to: string[] }
  headers: Record<string, string>
  raw: string
}

export interface FakeSmtp {
  host: string
  port: number
  dir: string
  stop(): Promise<void>
}

/** Largest message the catcher keeps; anything bigger is refused by the SMTP conversation itself. */
const MAX_MESSAGE_BYTES = 10 * 1024 * 1024
const ID_PATTERN = /^[0-9]{13}-[0-9a-f]{8}$/

/**
 * A development and test SMTP server on loopback that accepts any mail (authentication optional,
 * any credentials) and stores each message as one JSON file in `dir`. Never for production use.
 */
export async function startFakeSmtp(dir: string, port = 0): Promise<FakeSmtp> {
  mkdirSync(dir, { recursive: true })
  const server = new SMTPServer({
    authOptional: true,
    // plain text on loopback; no built-in demo certificate to warn about
    disabledCommands: ['STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? 'anyone' }),
    onData: (stream, session, callback) => {
      const chunks: Buffer[] = []
      stream.on('data', (chunk: Buffer) => chunks.push(chunk))
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large for the mail catcher'), { responseCode: 552 }))
        const envelope = {
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to: session.envelope.rcptTo.map((r) => r.address),
        }
        storeMessage(dir, envelope, Buffer.concat(chunks).toString('utf8')).then(() => callback(), callback)
      })
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.server.once('error', reject)
    server.listen(port, '127.0.0.1', () => resolve())
  })
  const address = server.server.address() as AddressInfo
  return {
    host: '127.0.0.1',
    port: address.port,
    dir,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}

async function storeMessage(dir: string, envelope: CaughtMail['envelope'], raw: string): Promise<void> {
  const id = `${Date.now()}-${randomBytes(4).toString('hex')}`
  const { headers, text, html } = readMessage(raw)
  const message: CaughtMail = {
    id,
    receivedAt: new Date().toISOString(),
    from: headers.from ?? envelope.from,
    to: envelope.to,
    subject: headers.subject ?? '',
    category: headers[CATEGORY_HEADER.toLowerCase()] ?? null,
    text,
    html,
    envelope,
    headers,
    raw,
  }
  // written whole, then renamed: a reader never sees half a file
  const file = path.join(dir, `${id}.json`)
  await writeFile(`${file}.part`, JSON.stringify(message))
  await rename(`${file}.part`, file)
}

/** Every message in the folder, newest first (without bodies); an absent folder is an empty mailbox. */
export function readMailbox(dir: string): CaughtMailSummaryDto[] {
  let names: string[]
  try {
    names = readdirSync(dir)
  } catch {
    return []
  }
  return names
    .filter((n) => n.endsWith('.json') && ID_PATTERN.test(n.slice(0, -5)))
    .sort()
    .reverse()
    .map((n) => {
      const { id, receivedAt, from, to, subject, category } = JSON.parse(readFileSync(path.join(dir, n), 'utf8')) as CaughtMail
      return { id, receivedAt, from, to, subject, category }
    })
}

/** One stored message, or null for an id that is not in the folder (malformed ids never touch the disk). */
export function readCaughtMail(dir: string, id: string): CaughtMail | null {
  if (!ID_PATTERN.test(id)) return null
  try {
    return JSON.parse(readFileSync(path.join(dir, `${id}.json`), 'utf8')) as CaughtMail
  } catch {
    return null
  }
}

// --- a minimal MIME reader: enough for what nodemailer writes (multipart/alternative, QP or base64, UTF-8) ---

interface Part {
  headers: Record<string, string>
  body: string
}

function splitPart(raw: string): Part {
  const normalized = raw.replace(/\r\n/g, '\n')
  const gap = normalized.indexOf('\n\n')
  const head = gap === -1 ? normalized : normalized.slice(0, gap)
  const body = gap === -1 ? '' : normalized.slice(gap + 2)
  const headers: Record<string, string> = {}
  // folded lines continue the header above them
  for (const line of head.replace(/\n[ \t]+/g, ' ').split('\n')) {
    const colon = line.indexOf(':')
    if (colon > 0) headers[line.slice(0, colon).trim().toLowerCase()] = decodeWords(line.slice(colon + 1).trim())
  }
  return { headers, body }
}

/** RFC 2047 encoded words (=?UTF-8?Q?…?= and =?UTF-8?B?…?=) in a header value. */
function decodeWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, charset: string, encoding: string, data: string) => {
      const bytes = encoding.toUpperCase() === 'B' ? Buffer.from(data, 'base64') : quotedPrintableBytes(data.replace(/_/g, ' '))
      return decodeCharset(bytes, charset)
    })
}

function quotedPrintableBytes(data: string): Buffer {
  const unwrapped = data.replace(/=\n/g, '')
  const bytes: number[] = []
  for (let i = 0; i < unwrapped.length; i++) {
    const hex = unwrapped.slice(i + 1, i + 3)
    if (unwrapped[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16))
      i += 2
    } else {
      bytes.push(...Buffer.from(unwrapped[i]!, 'utf8'))
    }
  }
  return Buffer.from(bytes)
}

function decodeCharset(bytes: Buffer, charset: string): string {
  try {
    return new TextDecoder(charset.toLowerCase()).decode(bytes)
  } catch {
    return bytes.toString('utf8')
  }
}

function param(header: string | undefined, name: string): string | undefined {
  const match = header?.match(new RegExp(`${name}="?([^";]+)"?`, 'i'))
  return match?.[1]
}

function decodeBody(part: Part): string {
  const encoding = (part.headers['content-transfer-encoding'] ?? '7bit').toLowerCase()
  const charset = param(part.headers['content-type'], 'charset') ?? 'utf-8'
  if (encoding === 'base64') return decodeCharset(Buffer.from(part.body.replace(/\s+/g, ''), 'base64'), charset)
  if (encoding === 'quoted-printable') return decodeCharset(quotedPrintableBytes(part.body), charset)
  return part.body
}

/** The text and HTML bodies of a message, walking nested multiparts. */
function readMessage(raw: string): { headers: Record<string, string>; text: string | null; html: string | null } {
  const top = splitPart(raw)
  const found: { text: string | null; html: string | null } = { text: null, html: null }
  const walk = (part: Part) => {
    const type = (part.headers['content-type'] ?? 'text/plain').toLowerCase()
    const boundary = param(part.headers['content-type'], 'boundary')
    if (type.startsWith('multipart/') && boundary) {
      const sections = part.body.split(`--${boundary}`).slice(1)
      for (const section of sections) {
        if (section.startsWith('--')) break
        walk(splitPart(section.replace(/^\n/, '')))
      }
    } else if (type.startsWith('text/html')) {
      found.html ??= decodeBody(part)
    } else if (type.startsWith('text/plain')) {
      found.text ??= decodeBody(part)
    }
  }
  walk(top)
  return { headers: top.headers, ...found }
}
