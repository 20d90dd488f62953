import nodemailer from 'nodemailer'
import type { AppConfig } from '../config'

export interface MailMessage {
  to: string
  subject: string
  text: string
  html: string
}

export interface Mailer {
  send(message: MailMessage): Promise<void>
}

/** nodemailer over SMTP: the configured server, or the local fake one on `fakeSmtpPort`. */
export function createMailer(config: AppConfig, fakeSmtpPort?: number): Mailer {
  const smtp = config.mail.smtp
  const transport = smtp
    ? nodemailer.createTransport({
        host: smtp.host,
        port: smtp.port,
        secure: smtp.secure,
        ...(smtp.user ? { auth: { user: smtp.user, pass: smtp.pass ?? '' } } : {}),
      })
    : nodemailer.createTransport({ host: '127.0.0.1', port: fakeSmtpPort, secure: false, ignoreTLS: true })
  return {
    async send(message) {
      await transport.sendMail({ from: config.mail.from, ...message })
    },
  }
}
