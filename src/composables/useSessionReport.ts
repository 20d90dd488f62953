import type { Equipment } from '@shared/domain/equipment'
import type { SessionReport, TakeNextStepsInput } from '@shared/schemas/run.schema'
import { getReport, getRunSession, takeNextSteps } from '@/api/run'
import { useAsync } from './useAsync'

export interface SessionReportData {
  report: SessionReport
  /** Each exercise's equipment (key "exerciseId:slotId"), so an edited next step steps by loadable loads. */
  equipment: Record<string, Equipment>
}

export const blockKey = (exerciseId: number, slotId: number | null) => `${exerciseId}:${slotId}`

/** A finished session's summary and next steps, and taking them. */
export function useSessionReport(id: number) {
  const async = useAsync<SessionReportData>(async () => {
    const [report, run] = await Promise.all([getReport(id), getRunSession(id).catch(() => null)])
    const equipment: Record<string, Equipment> = {}
    for (const exercise of run?.exercises ?? []) equipment[blockKey(exercise.exerciseId, exercise.slotId)] = exercise.equipment
    return { report, equipment }
  })

  async function take(steps: TakeNextStepsInput['steps']) {
    const report = await takeNextSteps(id, { steps })
    if (async.data.value) async.data.value = { ...async.data.value, report }
    return report
  }

  return { ...async, take }
}
