import { ApiError } from '@/api/client'

/**
 * Maps a 400's issues onto form field names ("email" or "body.email" -> "email").
 * Returns an empty object for any other error.
 */
export function fieldErrorsFrom(error: unknown): Record<string, string> {
  if (!(error instanceof ApiError) || error.status !== 400) return {}
  const errors: Record<string, string> = {}
  for (const issue of error.issues) {
    const field = issue.path.split('.').pop() ?? issue.path
    if (field && !errors[field]) errors[field] = issue.message
  }
  return errors
}
