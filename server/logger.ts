import { pino, type Logger } from 'pino'
import type { AppConfig } from './config'

/**
 * Structured JSON logs. Passwords, tokens and cookies never reach them: request bodies are not
 * logged at all, and the headers and fields that could carry a secret are redacted.
 */
export const REDACTED_PATHS = [
  'req.headers.authorization',
  'req.headers.cookie',
  'res.headers["set-cookie"]',
  'password',
  'token',
  '*.password',
  '*.token',
  'req.query.sig',
]

export function createLogger(config: Pick<AppConfig, 'logLevel'>, destination?: NodeJS.WritableStream): Logger {
  return pino({ level: config.logLevel, redact: { paths: REDACTED_PATHS, censor: '[redacted]' } }, destination as never)
}
