/** A field-level problem in a request, named by its dotted path ("sets.0.reps"). */
export interface FieldIssue {
  path: string
  message: string
}

/** The one error type services throw; the error handler turns it into JSON. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues?: FieldIssue[],
  ) {
    super(message)
    this.name = 'AppError'
  }

  static badRequest(message: string, issues?: FieldIssue[]) {
    return new AppError(400, 'validation_failed', message, issues)
  }
  static unauthenticated(message = 'Sign in first') {
    return new AppError(401, 'unauthenticated', message)
  }
  static forbidden(message = 'You are not allowed to do that') {
    return new AppError(403, 'forbidden', message)
  }
  static notFound(what = 'Resource') {
    return new AppError(404, 'not_found', `${what} not found`)
  }
  static conflict(code: string, message: string) {
    return new AppError(409, code, message)
  }
}
