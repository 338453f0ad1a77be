import path from 'node:path'
import { startFakeSmtp } from '../../server/mail/fake-smtp'

export interface LocalMail {
  /** SMTP_HOST, SMTP_PORT and MAILBOX_DIR for the API and the worker; empty when SMTP_HOST is set already. */
  env: Record<string, string>
  stop(): Promise<void>
}

/**
 * The local mail catcher for `npm start` and `npm run dev`: an SMTP server on loopback that keeps
 * every message under the data folder, shown to administrators on the Caught mail page. Skipped
 * when SMTP_HOST names a real server.
 */
export async function startLocalMail(dataDir: string, log: (line: string) => void): Promise<LocalMail> {
  if (process.env.SMTP_HOST) {
    log(`Sending mail through ${process.env.SMTP_HOST}`)
    return { env: {}, stop: async () => {} }
  }
  const smtp = await startFakeSmtp(path.join(dataDir, 'mailbox'))
  log(`Mail is caught on 127.0.0.1:${smtp.port} (nothing leaves this machine); administrators read it under Caught mail`)
  return { env: { SMTP_HOST: smtp.host, SMTP_PORT: String(smtp.port), MAILBOX_DIR: smtp.dir }, stop: () => smtp.stop() }
}
