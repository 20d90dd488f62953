import type { RequestHandler } from 'express'
import type { Role } from '@shared/schemas/common.schema'
import type { AppConfig } from '../config'
import { findUserForToken, UserModel } from '../db'
import { AppError } from '../errors'
import { verifyToken } from '../services/token.service'

/** Every authenticated handler reads the signed-in user from here. */
export function currentUser(locals: Record<string, unknown>): UserModel {
  const user = locals.user
  if (!(user instanceof UserModel)) throw AppError.unauthenticated()
  return user
}

/**
 * Checks the bearer token and loads its user from the database on every request, so that a
 * deactivated account or a password change takes effect at once on every API process.
 */
export const authenticate: RequestHandler = async (req, res, next) => {
  const header = req.get('authorization') ?? ''
  const match = /^Bearer\s+(\S+)$/i.exec(header)
  if (!match) throw AppError.unauthenticated()
  const config = req.app.locals.config as AppConfig
  const { userId, version } = verifyToken(config, match[1])
  const user = await findUserForToken(userId)
  if (!user || user.tokenVersion !== version) throw new AppError(401, 'invalid_token', 'Sign in again')
  if (!user.active) throw new AppError(401, 'account_disabled', 'This account is switched off')
  res.locals.user = user
  next()
}

/** Role check; ownership of each object is checked in the services. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (_req, res, next) => {
    const user = currentUser(res.locals)
    if (!roles.includes(user.role)) throw AppError.forbidden(`Only for: ${roles.join(', ')}`)
    next()
  }
}

/** Signs the user in when a token is sent; lets the request through without one. */
export const authenticateIfToken: RequestHandler = async (req, res, next) => {
  if (!req.get('authorization')) return next()
  return authenticate(req, res, next)
}
