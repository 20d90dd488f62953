import { listPlanTemplates } from '@/api/plans'
import { useAsync } from './useAsync'

/** The split templates a new plan starts from ("Blank" included). */
export function usePlanTemplates() {
  return useAsync(listPlanTemplates)
}
