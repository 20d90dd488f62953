import type { FieldRule } from 'vant'
import type { z } from '@shared/schemas/zod'

/**
 * A zod schema as a Vant field rule: the field is valid when the schema accepts its value,
 * otherwise Vant shows the schema's first message under the field.
 *
 * The schema may come from a loader (`() => import('@shared/schemas/x.schema').then(...)`), so a
 * form on the app's first screen does not build zod schemas before it is drawn; the rule then
 * answers with a promise (Vant waits for it).
 */
export function zodRule(schema: z.ZodMiniType | (() => Promise<z.ZodMiniType>), trigger: FieldRule['trigger'] = 'onSubmit'): FieldRule {
  const check = (checker: z.ZodMiniType, value: unknown) => {
    const result = checker.safeParse(value)
    return result.success ? true : (result.error.issues[0]?.message ?? 'Check this field')
  }
  return {
    trigger,
    validator: (value: unknown) => (typeof schema === 'function' ? schema().then((s) => check(s, value)) : check(schema, value)),
  }
}
