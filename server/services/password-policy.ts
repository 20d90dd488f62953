import { dictionary } from '@zxcvbn-ts/language-common'
import { AppError } from '../errors'

// The common-passwords list that ships with zxcvbn-ts (about 49,000 leaked passwords), as a set.
let common: Set<string> | undefined

/** Refuses passwords on the common-passwords list (NIST SP 800-63B §5.1.1.2 asks for this check). */
export function assertNotCommonPassword(password: string, path = 'password') {
  common ??= new Set((dictionary['passwords-common'] as string[]).map((p) => p.toLowerCase()))
  if (common.has(password.toLowerCase())) {
    throw AppError.badRequest('Choose a less common password', [
      { path, message: 'This password is on a list of common passwords: choose another' },
    ])
  }
}
