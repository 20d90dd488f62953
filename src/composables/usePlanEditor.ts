import { computed, ref, shallowRef, watch } from 'vue'
import { checkPlan, type CheckDay, type PlanChecks } from '@shared/domain/plan-checks'
import { DEFAULT_REST_SECONDS, DEFAULT_SCHEMES, type SetScheme, type SlotRole } from '@shared/domain/schemes'
import type { Exercise } from '@shared/schemas/exercise.schema'
import { planInputSchema, type Plan, type PlanInput, type RotationProposal, type Slot, type SlotInput } from '@shared/schemas/plan.schema'
import type { VersionLabel } from '@shared/schemas/session.schema'
import { ApiError } from '@/api/client'
import * as plansApi from '@/api/plans'
import { usePlan } from './usePlan'

/** One version's side of a slot: the exercise and its sets. */
export interface DraftSlotVersion {
  /** The server's slot id; absent until the plan is saved. */
  id?: number
  exerciseId: number | null
  exerciseName: string
  pattern: string
  primaryMuscles: string[]
  secondaryMuscles: string[]
  scheme: SetScheme
  restSec: number
}

/** A slot of the day's skeleton: one role, in both versions. */
export interface DraftSlot {
  key: string
  role: SlotRole
  versions: Record<VersionLabel, DraftSlotVersion>
}

export interface DraftDay {
  key: string
  id?: number
  name: string
  isRest: boolean
  slots: DraftSlot[]
}

export interface PlanDraft {
  name: string
  splitKind: string
  days: DraftDay[]
}

export const VERSIONS: readonly VersionLabel[] = ['I', 'II']

let nextKey = 0
const newKey = (prefix: string) => `${prefix}${++nextKey}`
// Plain JSON data (schemes); structuredClone cannot copy reactive proxies.
const clone = <T>(value: T): T => JSON.parse(JSON.stringify(value)) as T

function emptyVersion(role: SlotRole): DraftSlotVersion {
  return {
    exerciseId: null,
    exerciseName: '',
    pattern: '',
    primaryMuscles: [],
    secondaryMuscles: [],
    scheme: clone(DEFAULT_SCHEMES[role]),
    restSec: DEFAULT_REST_SECONDS[role],
  }
}

function fromSlot(slot: Slot): DraftSlotVersion {
  return {
    id: slot.id,
    exerciseId: slot.exerciseId,
    exerciseName: slot.exerciseName,
    pattern: slot.pattern,
    primaryMuscles: [...slot.primaryMuscles],
    secondaryMuscles: [...slot.secondaryMuscles],
    scheme: clone(slot.scheme),
    restSec: slot.restSec,
  }
}

/** The editor's working copy: the two versions' slots paired by position into one skeleton. */
export function toDraft(plan: Plan): PlanDraft {
  return {
    name: plan.name,
    splitKind: plan.splitKind,
    days: plan.days.map((day) => {
      const count = Math.max(day.versions.I.length, day.versions.II.length)
      const slots: DraftSlot[] = Array.from({ length: count }, (_, i) => {
        const one = day.versions.I[i]
        const two = day.versions.II[i]
        const role = (one ?? two).role
        return {
          key: newKey('slot'),
          role,
          versions: { I: one ? fromSlot(one) : emptyVersion(role), II: two ? fromSlot(two) : emptyVersion(role) },
        }
      })
      return { key: newKey('day'), id: day.id, name: day.name, isRest: day.isRest, slots }
    }),
  }
}

/** The PUT body: existing days and slots keep their ids, new ones go without. */
export function toPlanInput(draft: PlanDraft): PlanInput {
  const slotInput = (slot: DraftSlot, label: VersionLabel): SlotInput => {
    const side = slot.versions[label]
    return {
      ...(side.id ? { id: side.id } : {}),
      exerciseId: side.exerciseId ?? 0,
      role: slot.role,
      scheme: clone(side.scheme),
      restSec: side.restSec,
    }
  }
  return {
    name: draft.name,
    splitKind: draft.splitKind,
    days: draft.days.map((day) => ({
      ...(day.id ? { id: day.id } : {}),
      name: day.name,
      isRest: day.isRest,
      versions: {
        I: day.isRest ? [] : day.slots.map((s) => slotInput(s, 'I')),
        II: day.isRest ? [] : day.slots.map((s) => slotInput(s, 'II')),
      },
    })),
  }
}

/** What checkPlan needs from the draft. */
export function toCheckDays(draft: PlanDraft): CheckDay[] {
  return draft.days.map((day) => {
    const version = (label: VersionLabel) =>
      day.slots.map((slot) => {
        const side = slot.versions[label]
        return {
          role: slot.role,
          workingSets: side.scheme.sets.length,
          exerciseName: side.exerciseName || 'No exercise yet',
          pattern: side.pattern || undefined,
          primaryMuscles: side.primaryMuscles,
          secondaryMuscles: side.secondaryMuscles,
        }
      })
    return { name: day.name, isRest: day.isRest, versions: { I: version('I'), II: version('II') } }
  })
}

/** Issue paths ("days.0.versions.I.2.exerciseId") to messages, in the user's words. */
function issueMap(issues: ReadonlyArray<{ path: string; message: string }>): Record<string, string> {
  const map: Record<string, string> = {}
  for (const { path, message } of issues) {
    const key = path === '(root)' ? '' : path
    if (map[key]) continue
    map[key] = key.endsWith('.exerciseId') ? 'Pick an exercise' : message
  }
  return map
}

/**
 * The plan editor: loads the plan, keeps an editable draft, checks it live with checkPlan(),
 * validates it with planInputSchema and saves it with its ids; assigns it and rotates a version.
 */
export function usePlanEditor(planId: number) {
  const { data: plan, loading, error, refresh } = usePlan(planId)
  const draft = ref<PlanDraft | null>(null)
  const savedJson = ref('')
  const saving = ref(false)
  const triedToSave = ref(false)
  const serverIssues = shallowRef<Record<string, string>>({})

  function startFrom(loaded: Plan) {
    draft.value = toDraft(loaded)
    savedJson.value = JSON.stringify(toPlanInput(draft.value))
    triedToSave.value = false
  }

  watch(plan, (loaded) => {
    if (loaded) startFrom(loaded)
  }, { immediate: true })

  const input = computed(() => (draft.value ? toPlanInput(draft.value) : null))
  const dirty = computed(() => input.value !== null && JSON.stringify(input.value) !== savedJson.value)
  const checks = computed<PlanChecks | null>(() => (draft.value ? checkPlan(toCheckDays(draft.value)) : null))

  // A server's issues point at places by index: drop them once the draft changes.
  watch(input, () => {
    serverIssues.value = {}
  }, { deep: true })

  const clientIssues = computed<Record<string, string>>(() => {
    if (!triedToSave.value || !input.value) return {}
    const parsed = planInputSchema.safeParse(input.value)
    return parsed.success ? {} : issueMap(parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })))
  })
  const issues = computed<Record<string, string>>(() => ({ ...serverIssues.value, ...clientIssues.value }))

  /** Messages at exactly this path, or below it when `below` is set. */
  function issuesAt(path: string, below = false): string[] {
    return Object.entries(issues.value)
      .filter(([key]) => key === path || (below && key.startsWith(`${path}.`)))
      .map(([, message]) => message)
  }

  // Editing -------------------------------------------------------------------------------------

  const findDay = (dayKey: string) => draft.value?.days.find((d) => d.key === dayKey)
  const findSlot = (dayKey: string, slotKey: string) => findDay(dayKey)?.slots.find((s) => s.key === slotKey)

  function move<T>(list: T[], index: number, by: number) {
    const to = index + by
    if (index < 0 || to < 0 || to >= list.length) return
    const [item] = list.splice(index, 1)
    list.splice(to, 0, item)
  }

  function addTrainingDay() {
    if (!draft.value) return
    const n = draft.value.days.filter((d) => !d.isRest).length + 1
    draft.value.days.push({ key: newKey('day'), name: `Day ${n}`, isRest: false, slots: [] })
  }

  function addRestDay() {
    draft.value?.days.push({ key: newKey('day'), name: 'Rest', isRest: true, slots: [] })
  }

  function removeDay(dayKey: string) {
    if (!draft.value) return
    draft.value.days = draft.value.days.filter((d) => d.key !== dayKey)
  }

  function moveDay(dayKey: string, by: number) {
    if (!draft.value) return
    move(draft.value.days, draft.value.days.findIndex((d) => d.key === dayKey), by)
  }

  /** A new slot in the skeleton: both versions get it, each still to be given its exercise. */
  function addSlot(dayKey: string, role: SlotRole) {
    findDay(dayKey)?.slots.push({ key: newKey('slot'), role, versions: { I: emptyVersion(role), II: emptyVersion(role) } })
  }

  function removeSlot(dayKey: string, slotKey: string) {
    const day = findDay(dayKey)
    if (day) day.slots = day.slots.filter((s) => s.key !== slotKey)
  }

  function moveSlot(dayKey: string, slotKey: string, by: number) {
    const day = findDay(dayKey)
    if (day) move(day.slots, day.slots.findIndex((s) => s.key === slotKey), by)
  }

  /** A new role for the slot in both versions; both start again from the role's default sets and rest. */
  function setRole(dayKey: string, slotKey: string, role: SlotRole) {
    const slot = findSlot(dayKey, slotKey)
    if (!slot || slot.role === role) return
    slot.role = role
    for (const label of VERSIONS) {
      slot.versions[label].scheme = clone(DEFAULT_SCHEMES[role])
      slot.versions[label].restSec = DEFAULT_REST_SECONDS[role]
    }
  }

  /** The exercise of one version only. */
  function setExercise(dayKey: string, slotKey: string, version: VersionLabel, exercise: Exercise) {
    const slot = findSlot(dayKey, slotKey)
    if (!slot) return
    Object.assign(slot.versions[version], {
      exerciseId: exercise.id,
      exerciseName: exercise.name,
      pattern: exercise.pattern,
      primaryMuscles: [...exercise.primaryMuscles],
      secondaryMuscles: [...exercise.secondaryMuscles],
    })
  }

  function setScheme(dayKey: string, slotKey: string, versions: readonly VersionLabel[], scheme: SetScheme) {
    const slot = findSlot(dayKey, slotKey)
    if (slot) for (const label of versions) slot.versions[label].scheme = clone(scheme)
  }

  function setRest(dayKey: string, slotKey: string, version: VersionLabel, restSec: number) {
    const slot = findSlot(dayKey, slotKey)
    if (slot) slot.versions[version].restSec = restSec
  }

  // Saving, assigning, rotating -----------------------------------------------------------------

  /** Validates with the shared schema, then PUTs; true when saved. A 400's issues land at their places. */
  async function save(): Promise<boolean> {
    if (!input.value) return false
    triedToSave.value = true
    const parsed = planInputSchema.safeParse(input.value)
    if (!parsed.success) return false
    saving.value = true
    try {
      plan.value = await plansApi.replacePlan(planId, parsed.data)
      return true
    } catch (e) {
      if (e instanceof ApiError && e.status === 400) {
        serverIssues.value = issueMap(e.issues)
        return false
      }
      throw e
    } finally {
      saving.value = false
    }
  }

  async function assign(athleteIds: number[], startDate: string) {
    await plansApi.assignPlan(planId, { athleteIds, startDate })
  }

  async function proposeRotation(dayId: number, version: VersionLabel): Promise<RotationProposal> {
    return plansApi.proposeRotation(planId, { dayId, version })
  }

  /** Applies the ticked swaps of a proposal; the other version stays as it is. */
  async function applyRotation(proposal: RotationProposal, slotIds: readonly number[]) {
    const swaps = proposal.swaps.filter((s) => slotIds.includes(s.slotId)).map((s) => ({ slotId: s.slotId, toExerciseId: s.toExerciseId }))
    plan.value = await plansApi.applyRotation(planId, { dayId: proposal.dayId, version: proposal.version, swaps })
  }

  return {
    plan,
    loading,
    error,
    refresh,
    draft,
    dirty,
    checks,
    issues,
    issuesAt,
    saving,
    addTrainingDay,
    addRestDay,
    removeDay,
    moveDay,
    addSlot,
    removeSlot,
    moveSlot,
    setRole,
    setExercise,
    setScheme,
    setRest,
    save,
    assign,
    proposeRotation,
    applyRotation,
  }
}
