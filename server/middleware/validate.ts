import type { RequestHandler } from 'express'
import type { z } from '@shared/schemas/zod'
import { AppError, type FieldIssue } from '../errors'

type Schemas = { body?: z.ZodMiniType; query?: z.ZodMiniType; params?: z.ZodMiniType }

export function toFieldIssues(error: z.core.$ZodError, prefix?: string): FieldIssue[] {
  return error.issues.map((issue) => ({
    path: [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || '(root)',
    message: issue.message,
  }))
}

/**
 * Validates the parts of a request against shared zod schemas and puts the parsed values on
 * res.locals.body / .query / .params (Express 5 makes req.query read-only).
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    const issues: FieldIssue[] = []
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part]
      if (!schema) continue
      const result = schema.safeParse(req[part] ?? {})
      if (result.success) res.locals[part] = result.data
      else issues.push(...toFieldIssues(result.error, part === 'body' ? undefined : part))
    }
    if (issues.length > 0) return next(AppError.badRequest('Some fields are not valid', issues))
    next()
  }
}
