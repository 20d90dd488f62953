import { createSecretKey, type KeyObject } from 'node:crypto'
import jwt from 'jsonwebtoken'
import type { AppConfig } from '../config'
import { AppError } from '../errors'

interface TokenClaims {
  sub: string
  /** The user's token version when the token was made; a bump invalidates older tokens. */
  ver: number
}

const secretKeys = new Map<string, KeyObject>()

/**
 * The secret as a KeyObject, made once. Given a string, jsonwebtoken first tries to read it as a
 * public key on every call and catches the error: about 1 ms per request, the largest single
 * cost of a set log in the benchmark's CPU profile.
 */
function secretKey(config: AppConfig): KeyObject {
  let key = secretKeys.get(config.jwtSecret)
  if (!key) {
    key = createSecretKey(Buffer.from(config.jwtSecret, 'utf8'))
    secretKeys.set(config.jwtSecret, key)
  }
  return key
}

export function issueToken(config: AppConfig, user: { id: number; tokenVersion: number }): string {
  return jwt.sign({ ver: user.tokenVersion }, secretKey(config), {
    subject: String(user.id),
    expiresIn: config.jwtTtl as jwt.SignOptions['expiresIn'],
    algorithm: 'HS256',
  })
}

export function verifyToken(config: AppConfig, token: string): { userId: number; version: number } {
  try {
    const claims = jwt.verify(token, secretKey(config), { algorithms: ['HS256'] }) as unknown as TokenClaims
    const userId = Number(claims.sub)
    if (!Number.isInteger(userId) || typeof claims.ver !== 'number') throw AppError.unauthenticated()
    return { userId, version: claims.ver }
  } catch (err) {
    if (err instanceof jwt.TokenExpiredError) {
      throw new AppError(401, 'token_expired', 'Your sign-in has expired: sign in again')
    }
    throw new AppError(401, 'invalid_token', 'Sign in again')
  }
}
