import { describe, expect, it } from 'vitest'
import { registerSchema } from '@shared/schemas/auth.schema'
import { zodRule } from '@/utils/zod-rule'

describe('zodRule', () => {
  const validate = (value: unknown) => {
    const rule = zodRule(registerSchema.shape.password)
    return rule.validator!(value, rule)
  }

  it('passes a value the schema accepts', () => {
    expect(validate('long enough password')).toBe(true)
  })

  it("returns the schema's own message for a value it refuses", () => {
    expect(validate('short')).toBe('Use at least 10 characters')
  })

  it('takes the schema from a loader, answering with a promise of the same result', async () => {
    const rule = zodRule(() => Promise.resolve(registerSchema.shape.password))

    await expect(rule.validator!('long enough password', rule)).resolves.toBe(true)
    await expect(rule.validator!('short', rule)).resolves.toBe('Use at least 10 characters')
  })
})
