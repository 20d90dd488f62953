import { ref, watch } from 'vue'
import type { PlanFromTemplateInput } from '@shared/schemas/plan.schema'
import * as plansApi from '@/api/plans'
import { useAsync } from './useAsync'

/** The signed-in author's plans (current or archived) and what can be done to one from the list. */
export function usePlans() {
  const archived = ref(false)
  const list = useAsync(() => plansApi.listPlans({ archived: archived.value }))
  watch(archived, () => list.refresh())

  async function createFromTemplate(input: PlanFromTemplateInput) {
    return plansApi.createPlanFromTemplate(input)
  }

  async function duplicate(id: number) {
    const plan = await plansApi.duplicatePlan(id)
    await list.refresh()
    return plan
  }

  async function rename(id: number, name: string) {
    await plansApi.updatePlan(id, { name })
    await list.refresh()
  }

  async function setArchived(id: number, value: boolean) {
    await plansApi.updatePlan(id, { archived: value })
    await list.refresh()
  }

  return { ...list, archived, createFromTemplate, duplicate, rename, setArchived }
}
