import nodemailer, { type Transporter } from 'nodemailer'
import type { Logger } from 'pino'
import type { MailConfig } from '../config'

export interface OutgoingMail {
  to: string
  subject: string
  text: string
  html: string
  /** Extra headers, e.g. the category for the mail catcher and for filters in mail clients. */
  headers?: Record<string, string>
}

/** Sends mail over SMTP as configured; with no SMTP_HOST it logs each mail and drops it. */
export class Mailer {
  private transport?: Transporter

  constructor(
    private readonly config: MailConfig,
    private readonly logger: Logger,
  ) {}

  /** True when sent, false when dropped for want of an SMTP server. A refusal by the server throws, so the job retries. */
  async send(mail: OutgoingMail): Promise<boolean> {
    if (!this.config.smtpHost) {
      this.logger.info({ to: mail.to, subject: mail.subject }, 'SMTP_HOST is not set: the mail is logged here and dropped')
      return false
    }
    this.transport ??= nodemailer.createTransport({
      host: this.config.smtpHost,
      port: this.config.smtpPort,
      secure: this.config.smtpSecure,
      auth: this.config.smtpUser ? { user: this.config.smtpUser, pass: this.config.smtpPass ?? '' } : undefined,
    })
    await this.transport.sendMail({ from: this.config.from, ...mail })
    return true
  }

  close(): void {
    this.transport?.close()
    this.transport = undefined
  }
}
