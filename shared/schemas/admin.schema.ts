import { z } from './zod'
import { roleSchema } from './common.schema'

export const adminUpdateUserSchema = z
  .partial(z.object({ role: roleSchema, active: z.boolean() }))
  .check(z.refine((v) => Object.keys(v).length > 0, 'Send at least one field'))
export type AdminUpdateUserInput = z.infer<typeof adminUpdateUserSchema>

export const adminUserRowSchema = z.object({
  id: z.int(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
  active: z.boolean(),
  lastSessionAt: z.nullable(z.string()),
  createdAt: z.string(),
})
export type AdminUserRow = z.infer<typeof adminUserRowSchema>
