import { Router, type RequestHandler } from 'express'
import { AppError } from '../errors'
import type { AppConfig } from '../config'
import { readOutbox } from '../mail/outbox'

const escape = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')
const linkify = (s: string) => escape(s).replace(/https?:\/\/[^\s<]+/g, (url) => `<a href="${url}">${url}</a>`)

/**
 * The outbox holds live invitation and password-reset links, so only this machine may read it:
 * the address of the connection itself, not a forwarded header, must be loopback. A deployment
 * for other people sets SMTP_HOST, and then these routes do not exist at all.
 */
export const loopbackOnly: RequestHandler = (req, _res, next) => {
  const address = req.socket.remoteAddress ?? ''
  if (address === '127.0.0.1' || address === '::1' || address === '::ffff:127.0.0.1') return next()
  next(AppError.notFound('Page'))
}

/**
 * The local outbox, only while the app uses its own fake SMTP server: a page listing every
 * message so a person can click an invitation link, and the same as JSON for tests.
 */
export function devRoutes(config: AppConfig) {
  const dev = Router()
  dev.use(['/api/dev', '/dev'], loopbackOnly)
  dev.get('/api/dev/outbox', async (_req, res) => {
    res.json({ messages: await readOutbox(config.mail.outboxDir) })
  })
  dev.get('/dev/outbox', async (_req, res) => {
    const messages = await readOutbox(config.mail.outboxDir)
    const items = messages
      .map(
        (m) => `<article><h2>${escape(m.subject)}</h2><p class="meta">To ${escape(m.to)} · ${escape(m.date)}</p><pre>${linkify(m.text)}</pre></article>`,
      )
      .join('\n')
    res.type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Outbox · Chalkline (development)</title>
<style>body{font-family:sans-serif;background:#F2EFE6;color:#12343B;max-width:760px;margin:0 auto;padding:16px}article{background:#fff;border-radius:8px;padding:12px 16px;margin:12px 0}pre{white-space:pre-wrap;font-family:inherit}.meta{color:#4a5a5e;font-size:14px}</style>
</head><body><h1>Outbox</h1><p>E-mails the app sent to its local test mail server (no e-mail leaves this machine).</p>${items || '<p>No messages yet.</p>'}</body></html>`)
  })
  return dev
}
