import { toValue, watch, type MaybeRefOrGetter } from 'vue'
import type { Plan } from '@shared/schemas/plan.schema'
import { getPlan } from '@/api/plans'
import { useAsync } from './useAsync'

/** One plan with its days, versions and slots; nothing is loaded while the id is null. */
export function usePlan(id: MaybeRefOrGetter<number | null>) {
  const plan = useAsync<Plan | null>(async () => {
    const planId = toValue(id)
    return planId === null ? null : getPlan(planId)
  })
  watch(
    () => toValue(id),
    () => plan.refresh(),
  )
  return plan
}
