import type { FieldRule } from 'vant'
import type { ZodType } from 'zod'

/**
 * A zod schema as a Vant field rule: the field is valid when the schema accepts its value,
 * otherwise Vant shows the schema's first message under the field.
 */
export function zodRule(schema: ZodType, trigger: FieldRule['trigger'] = 'onSubmit'): FieldRule {
  return {
    trigger,
    validator: (value: unknown) => {
      const result = schema.safeParse(value)
      return result.success ? true : (result.error.issues[0]?.message ?? 'Check this field')
    },
  }
}
