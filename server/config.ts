import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import { z } from '@shared/schemas/zod'

const booleanFromEnv = z.pipe(z.enum(['true', 'false', '1', '0']), z.transform((v) => v === 'true' || v === '1'))

const envSchema = z.object({
  NODE_ENV: z._default(z.enum(['development', 'production', 'test']), 'development'),
  PORT: z._default(z.pipe(z.coerce.number(), z.int().check(z.gte(0), z.lte(65535))), 3000),
  HOST: z._default(z.string(), '0.0.0.0'),
  DATABASE_PATH: z._default(z.string(), 'data/chalkline.sqlite'),
  /** When unset, a secret is generated on first run and kept next to the database. */
  JWT_SECRET: z.optional(z.string().check(z.minLength(32, 'JWT_SECRET must be at least 32 characters'))),
  JWT_TTL: z._default(z.string().check(z.regex(/^\d+[smhd]$/, 'JWT_TTL looks like 12h or 7d')), '7d'),
  /** bcrypt cost factor; 10 is the floor (OWASP Password Storage Cheat Sheet). */
  BCRYPT_COST: z._default(z.pipe(z.coerce.number(), z.int().check(z.gte(10), z.lte(15))), 12),
  /** Load the demo club when the database has no users. */
  SEED_DEMO: z._default(booleanFromEnv, true),
  /** Serve the built client from this folder (production mode). */
  CLIENT_DIST: z._default(z.string(), 'dist/client'),
  /** Where links in e-mails point; defaults to http://localhost:<PORT>. */
  APP_URL: z.optional(z.url()),
  /** A real SMTP server; without SMTP_HOST the app starts its own local fake SMTP server. */
  SMTP_HOST: z.optional(z.string().check(z.minLength(1))),
  SMTP_PORT: z._default(z.pipe(z.coerce.number(), z.int().check(z.gte(1), z.lte(65535))), 587),
  SMTP_SECURE: z._default(booleanFromEnv, false),
  SMTP_USER: z.optional(z.string()),
  SMTP_PASS: z.optional(z.string()),
  MAIL_FROM: z._default(z.string(), 'Chalkline <no-reply@chalkline.localhost>'),
  /** Form-check videos: where they are kept and the largest accepted, in megabytes. */
  UPLOAD_DIR: z.optional(z.string()),
  UPLOAD_MAX_MB: z._default(z.coerce.number().check(z.gte(1), z.lte(2000)), 100),
  /** Sign-in, registration, password reset and invitation attempts per client address per 15 minutes. */
  RATE_LIMIT_AUTH: z.optional(z.pipe(z.coerce.number(), z.int().check(z.gte(1), z.lte(100000)))),
  LOG_LEVEL: z.optional(z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'])),
  /** How long an invitation link works. */
  INVITE_TTL_HOURS: z._default(z.pipe(z.coerce.number(), z.int().check(z.gte(1), z.lte(24 * 30))), 24 * 7),
})

export interface AppConfig {
  env: 'development' | 'production' | 'test'
  port: number
  host: string
  databasePath: string
  jwtSecret: string
  jwtTtl: string
  bcryptCost: number
  seedDemo: boolean
  clientDist: string | null
  appUrl: string
  mail: {
    from: string
    /** null: start the local fake SMTP server and keep messages in `outboxDir`. */
    smtp: { host: string; port: number; secure: boolean; user?: string; pass?: string } | null
    outboxDir: string
  }
  inviteTtlHours: number
  uploads: { dir: string; maxBytes: number }
  rateLimitAuth: number
  logLevel: 'fatal' | 'error' | 'warn' | 'info' | 'debug' | 'trace' | 'silent'
}

/** Reads a kept secret, or makes one and keeps it, so tokens survive a restart. */
function loadOrCreateSecret(databasePath: string): string {
  const file = resolve(dirname(databasePath), 'jwt-secret')
  if (existsSync(file)) return readFileSync(file, 'utf8').trim()
  mkdirSync(dirname(file), { recursive: true })
  const secret = randomBytes(48).toString('base64url')
  writeFileSync(file, secret + '\n', { mode: 0o600 })
  return secret
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = envSchema.safeParse(env)
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`)
    throw new Error(`Bad configuration in environment variables:\n${lines.join('\n')}`)
  }
  const e = parsed.data
  const databasePath = e.DATABASE_PATH === ':memory:' ? e.DATABASE_PATH : resolve(e.DATABASE_PATH)
  return {
    env: e.NODE_ENV,
    port: e.PORT,
    host: e.HOST,
    databasePath,
    jwtSecret: e.JWT_SECRET ?? loadOrCreateSecret(databasePath),
    jwtTtl: e.JWT_TTL,
    bcryptCost: e.BCRYPT_COST,
    seedDemo: e.SEED_DEMO,
    clientDist: e.NODE_ENV === 'production' ? resolve(e.CLIENT_DIST) : null,
    appUrl: (e.APP_URL ?? `http://localhost:${e.PORT}`).replace(/\/$/, ''),
    mail: {
      from: e.MAIL_FROM,
      smtp: e.SMTP_HOST
        ? { host: e.SMTP_HOST, port: e.SMTP_PORT, secure: e.SMTP_SECURE, user: e.SMTP_USER, pass: e.SMTP_PASS }
        : null,
      outboxDir: databasePath === ':memory:' ? resolve('data/outbox') : resolve(dirname(databasePath), 'outbox'),
    },
    inviteTtlHours: e.INVITE_TTL_HOURS,
    // Tests sign in many times from one address; they set a low limit where they test the limit itself.
    rateLimitAuth: e.RATE_LIMIT_AUTH ?? (e.NODE_ENV === 'test' ? 10_000 : 20),
    logLevel: e.LOG_LEVEL ?? (e.NODE_ENV === 'test' ? 'silent' : 'info'),
    uploads: {
      dir: resolve(e.UPLOAD_DIR ?? (databasePath === ':memory:' ? 'data/uploads' : resolve(dirname(databasePath), 'uploads'))),
      maxBytes: Math.round(e.UPLOAD_MAX_MB * 1024 * 1024),
    },
  }
}
