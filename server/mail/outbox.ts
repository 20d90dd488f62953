import { readdirSync, readFileSync, existsSync } from 'node:fs'
import { join } from 'node:path'
import { simpleParser } from 'mailparser'

export interface OutboxMessage {
  id: string
  to: string
  subject: string
  date: string
  text: string
  html: string | null
}

/** Messages the fake SMTP server kept, newest first. */
export async function readOutbox(outboxDir: string, limit = 100): Promise<OutboxMessage[]> {
  if (!existsSync(outboxDir)) return []
  const files = readdirSync(outboxDir).filter((f) => f.endsWith('.eml')).sort().reverse().slice(0, limit)
  return Promise.all(
    files.map(async (file) => {
      const mail = await simpleParser(readFileSync(join(outboxDir, file)))
      const to = Array.isArray(mail.to) ? mail.to.map((a) => a.text).join(', ') : (mail.to?.text ?? '')
      return {
        id: file.replace(/\.eml$/, ''),
        to,
        subject: mail.subject ?? '',
        date: (mail.date ?? new Date(0)).toISOString(),
        text: mail.text ?? '',
        html: typeof mail.html === 'string' ? mail.html : null,
      }
    }),
  )
}
