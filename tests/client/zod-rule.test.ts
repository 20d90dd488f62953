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
})
