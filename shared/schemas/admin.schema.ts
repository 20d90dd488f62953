import { z } from 'zod'
import { roleSchema } from './common.schema'

export const adminUpdateUserSchema = z
  .object({ role: roleSchema, active: z.boolean() })
  .partial()
  .refine((v) => Object.keys(v).length > 0, 'Send at least one field')
export type AdminUpdateUserInput = z.infer<typeof adminUpdateUserSchema>

export const adminUserRowSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
  active: z.boolean(),
  lastSessionAt: z.string().nullable(),
  createdAt: z.string(),
})
export type AdminUserRow = z.infer<typeof adminUserRowSchema>
