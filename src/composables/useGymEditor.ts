import { computed, ref, shallowRef, watch } from 'vue'
import { defaultGym, gymProfileSchema, loadRangeOf, type GymProfile, type LoadRange } from '@shared/domain/gym'
import type { Equipment } from '@shared/domain/equipment'
import type { Unit } from '@shared/domain/units'
import { gymInputSchema, type GymAnswer } from '@shared/schemas/gym.schema'
import { getAthleteGym, getMyGym, saveAthleteGym, saveMyGym } from '@/api/gym'
import { ApiError } from '@/api/client'
import { useAsync } from './useAsync'

/** What each piece of the gym can load, in its own unit; null where the form is not valid yet. */
export interface GymLoadRanges {
  barbell: LoadRange | null
  sled: LoadRange | null
  dumbbell: LoadRange | null
  stack: LoadRange | null
}

/** Field problems by dotted path ("barbell.plates.0.mass"), from the schema or the server. */
export type GymIssues = Record<string, string>

/** A deep copy to edit: presets and answers stay as they are (the engine caches by object). */
const copyOf = (gym: GymProfile): GymProfile => JSON.parse(JSON.stringify(gym))

function rangeOf(equipment: Equipment): LoadRange | null {
  try {
    return loadRangeOf(equipment)
  } catch {
    return null
  }
}

function issuesFrom(list: ReadonlyArray<{ path: ReadonlyArray<PropertyKey> | string; message: string }>): GymIssues {
  const issues: GymIssues = {}
  for (const issue of list) {
    const path = typeof issue.path === 'string' ? issue.path : issue.path.map(String).join('.')
    issues[path] ??= issue.message
  }
  return issues
}

/**
 * The gym editor: the lifter's own gym (no athlete id) or, for their coach, an athlete's. Holds
 * a draft to edit, starts it from a unit's preset, says what the draft can load, and saves it
 * after checking it with the same schema the server uses.
 */
export function useGymEditor(athleteId: number | null = null) {
  const loaded = useAsync<GymAnswer>(() => (athleteId === null ? getMyGym() : getAthleteGym(athleteId)))
  const draft = ref<GymProfile | null>(null)
  const issues = shallowRef<GymIssues>({})
  const saving = ref(false)
  const saveError = ref<string | null>(null)

  watch(
    loaded.data,
    (answer) => {
      if (answer) draft.value = copyOf(answer.gym)
    },
    { immediate: true },
  )

  /** The draft as the engine will see it (collarMass from the collars); null while it does not parse. */
  const completed = computed(() => {
    const parsed = draft.value ? gymProfileSchema.safeParse(draft.value) : null
    return parsed?.success ? parsed.data : null
  })

  const loadRanges = computed<GymLoadRanges>(() => {
    const gym = completed.value
    return {
      barbell: gym && rangeOf(gym.barbell),
      sled: gym && rangeOf(gym.sled),
      dumbbell: gym && rangeOf(gym.dumbbell),
      stack: gym && rangeOf(gym.stack),
    }
  })

  const changed = computed(() => {
    const saved = loaded.data.value
    if (!saved || !draft.value) return false
    // Compared as the server would store them, so a stale derived field is no change.
    const input = (gym: GymProfile) => JSON.stringify(gymInputSchema.safeParse(gym).data ?? gym)
    return input(draft.value) !== input(saved.gym)
  })

  function startFrom(unit: Unit) {
    draft.value = copyOf(defaultGym(unit))
    issues.value = {}
  }

  function discardChanges() {
    if (loaded.data.value) draft.value = copyOf(loaded.data.value.gym)
    issues.value = {}
    saveError.value = null
  }

  /** True when saved; otherwise `issues` or `saveError` says why. */
  async function save(): Promise<boolean> {
    saveError.value = null
    if (!draft.value) return false
    const parsed = gymInputSchema.safeParse(draft.value)
    if (!parsed.success) {
      issues.value = issuesFrom(parsed.error.issues)
      return false
    }
    issues.value = {}
    saving.value = true
    try {
      loaded.data.value = await (athleteId === null ? saveMyGym(parsed.data) : saveAthleteGym(athleteId, parsed.data))
      return true
    } catch (e) {
      if (e instanceof ApiError && e.status === 400 && e.issues.length) issues.value = issuesFrom(e.issues)
      else saveError.value = e instanceof Error && e.message ? e.message : 'Could not save the gym. Try again.'
      return false
    } finally {
      saving.value = false
    }
  }

  return { ...loaded, draft, issues, saving, saveError, loadRanges, changed, startFrom, discardChanges, save }
}
