import { computed, ref } from 'vue'
import type { Equipment } from '@shared/domain/equipment'
import type { ExerciseReport, SessionReport, TakeNextStepsInput } from '@shared/schemas/run.schema'
import { getReport, getRunSession, takeNextSteps } from '@/api/run'
import { defaultChoice, isOffered, stepFor, type NextStepChoiceOption } from '@/utils/next-step-text'
import { useAsync } from './useAsync'

export interface SessionReportData {
  report: SessionReport
  /** Each exercise's equipment (key "exerciseId:slotId"), so an edited next step steps by loadable loads. */
  equipment: Record<string, Equipment>
}

export const blockKey = (exerciseId: number, slotId: number | null) => `${exerciseId}:${slotId}`
const keyOf = (exercise: ExerciseReport) => blockKey(exercise.exerciseId, exercise.slotId)

/**
 * A finished session's summary and next steps: the choice the lifter picked per exercise (the
 * next step until they pick another), taking one exercise's choice, and Take all, which takes
 * the picked choice of every exercise not taken yet.
 */
export function useSessionReport(id: number) {
  const async = useAsync<SessionReportData>(async () => {
    const [report, run] = await Promise.all([getReport(id), getRunSession(id).catch(() => null)])
    const equipment: Record<string, Equipment> = {}
    for (const exercise of run?.exercises ?? []) equipment[blockKey(exercise.exerciseId, exercise.slotId)] = exercise.equipment
    return { report, equipment }
  })

  const picked = ref<Record<string, NextStepChoiceOption>>({})

  /** The picked choice while the report still offers it, else what was taken or the next step. */
  function choiceOf(exercise: ExerciseReport): NextStepChoiceOption {
    const mine = picked.value[keyOf(exercise)]
    return mine && isOffered(exercise, mine) ? mine : defaultChoice(exercise)
  }

  function choose(exercise: ExerciseReport, option: NextStepChoiceOption) {
    picked.value = { ...picked.value, [keyOf(exercise)]: option }
  }

  const untaken = computed(() => async.data.value?.report.exercises.filter((e) => e.nextStep && !e.taken) ?? [])

  async function take(steps: TakeNextStepsInput['steps']) {
    const report = await takeNextSteps(id, { steps })
    if (async.data.value) async.data.value = { ...async.data.value, report }
    return report
  }

  /** Every exercise not taken yet, each with its picked choice, in one request. */
  async function takeAll() {
    const steps = untaken.value.map((e) => stepFor(e, choiceOf(e))).filter((s) => s !== null)
    if (steps.length) await take(steps)
  }

  return { ...async, choiceOf, choose, untaken, take, takeAll }
}
