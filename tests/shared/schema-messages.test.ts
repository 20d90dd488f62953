import { describe, expect, it } from 'vitest'
import { updatePlanSchema } from '../../shared/schemas/plan.schema'
import { signInSchema } from '../../shared/schemas/auth.schema'

// The schemas use zod's mini build, which ships no messages of its own; shared/schemas/zod.ts sets
// the English ones. A field without a message of its own must still say what is wrong, in the
// API's field issues and under a form field alike.
describe('schema messages', () => {
  it("gives a field without a message of its own zod's English message", () => {
    const result = updatePlanSchema.safeParse({ name: 'x'.repeat(81) })
    expect(result.success).toBe(false)
    expect(result.error?.issues[0]).toMatchObject({ path: ['name'], message: 'Too big: expected string to have <=80 characters' })
  })

  it('keeps the messages written on the schema', () => {
    const result = signInSchema.safeParse({ email: 'not an address', password: '' })
    expect(result.error?.issues.map((i) => i.message)).toEqual(['Enter a valid e-mail address', 'Enter your password'])
  })
})
