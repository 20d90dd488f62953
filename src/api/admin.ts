import { z } from '@shared/schemas/zod'
import {
  adminUserRowSchema,
  type AdminUpdateUserInput,
  type AdminUserRow,
} from '@shared/schemas/admin.schema'
import { request } from './client'

const userListSchema = z.object({ users: z.array(adminUserRowSchema) })
const userEnvelopeSchema = z.object({ user: adminUserRowSchema })

export async function listUsers(): Promise<AdminUserRow[]> {
  return (await request('GET', '/admin/users', { schema: userListSchema })).users
}

export async function updateUser(id: number, input: AdminUpdateUserInput): Promise<AdminUserRow> {
  return (await request('PATCH', `/admin/users/${id}`, { body: input, schema: userEnvelopeSchema })).user
}
