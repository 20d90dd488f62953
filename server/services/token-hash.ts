import { createHash, randomBytes } from 'node:crypto'

/** A random single-use token for a link, and the SHA-256 that is all the database keeps of it. */
export function newLinkToken() {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashLinkToken(token) }
}

export function hashLinkToken(token: string) {
  return createHash('sha256').update(token).digest('hex')
}
