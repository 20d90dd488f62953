/**
 * Equipment profiles and what loads they can make.
 *
 * Loadability is computed in the equipment's own unit (a pound gym's plates are pounds) on an
 * integer grid of 1/1,000,000 of that unit, so 2.5 + 2.5 + 45 is exact. Public functions take and
 * return kilograms (`...Kg`) as stored, plus the load in the equipment unit for display.
 */
import { z } from 'zod/mini'
import { EngineError, assertLoad } from './errors'
import { fromKg, snap, toKg, type Unit } from './units'

export const EQUIPMENT_KINDS = ['barbell', 'dumbbell', 'stack', 'bodyweight', 'any'] as const
export type EquipmentKind = (typeof EQUIPMENT_KINDS)[number]

const unitSchema = z.enum(['kg', 'lb'])
const massSchema = z.number().check(z.positive())
/** A kind of loose weight and how many are on hand: plate pairs for a bar, single pieces otherwise. */
const stockSchema = z.object({ mass: massSchema, count: z.int().check(z.gte(0), z.lte(100)) })

export const barbellSchema = z.object({
  kind: z.literal('barbell'),
  name: z.optional(z.string().check(z.maxLength(80))),
  unit: unitSchema,
  barMass: massSchema,
  /** Mass of ONE collar; two are used and counted in the load (IWF). 0 when the gym lifts without. */
  collarMass: z.number().check(z.gte(0)),
  /** Plate PAIRS on hand: `count` pairs of `mass`, i.e. `count` plates per side at most. */
  plates: z.array(stockSchema).check(z.maxLength(30)),
})
export const dumbbellSchema = z.object({
  kind: z.literal('dumbbell'),
  name: z.optional(z.string().check(z.maxLength(80))),
  unit: unitSchema,
  /** Fixed dumbbell pairs on hand; the load is the mass of ONE dumbbell (as lifters log it). */
  pairs: z.array(massSchema).check(z.minLength(1), z.maxLength(200)),
})
export const stackSchema = z.object({
  kind: z.literal('stack'),
  name: z.optional(z.string().check(z.maxLength(80))),
  unit: unitSchema,
  /** Every load the pin can select. */
  steps: z.array(z.number().check(z.gte(0))).check(z.minLength(1), z.maxLength(200)),
  /** Optional add-on weights that hang on the stack (e.g. a 2.5 lb magnet), with counts. */
  addOns: z.array(stockSchema).check(z.maxLength(10)),
})
export const bodyweightSchema = z.object({
  kind: z.literal('bodyweight'),
  name: z.optional(z.string().check(z.maxLength(80))),
  unit: unitSchema,
  /** Loose weights that can be added (belt plates, a dumbbell between the feet); load = added load. */
  added: z.array(stockSchema).check(z.maxLength(20)),
})
export const anyLoadSchema = z.object({
  kind: z.literal('any'),
  name: z.optional(z.string().check(z.maxLength(80))),
  unit: unitSchema,
  step: massSchema,
  min: z.number().check(z.gte(0)),
  max: z.optional(massSchema),
})

/** An equipment profile a gym (or lifter) keeps; the server stores and validates it with this. */
export const equipmentSchema = z.discriminatedUnion('kind', [
  barbellSchema,
  dumbbellSchema,
  stackSchema,
  bodyweightSchema,
  anyLoadSchema,
])
export type Equipment = z.infer<typeof equipmentSchema>
export type BarbellEquipment = z.infer<typeof barbellSchema>

// ---------------------------------------------------------------------------------------------
// Presets: plain data a gym copies and edits.

/** IWF discs, kg: 25, 20, 15, 10, 5, 2.5, 2, 1.5, 1, 0.5 (IWF Technical and Competition Rules). */
export const IWF_PLATES_KG = [25, 20, 15, 10, 5, 2.5, 2, 1.5, 1, 0.5] as const
/** IWF men's bar 20 kg, women's bar 15 kg; collars 2.5 kg each, counted in the total. */
export const IWF_MEN_BAR_KG = 20
export const IWF_WOMEN_BAR_KG = 15
export const IWF_COLLAR_KG = 2.5

// Pair counts in the kilogram presets are common practice (no standard says how many a gym owns).
const competitionPairs = (): { mass: number; count: number }[] =>
  IWF_PLATES_KG.map((mass) => ({ mass, count: mass === 25 ? 4 : 1 }))

/** Standard kilogram competition set on the 20 kg bar with 2.5 kg collars (IWF/IPF masses). */
export const KG_COMPETITION_SET: BarbellEquipment = {
  kind: 'barbell',
  name: 'Kilogram competition set, 20 kg bar',
  unit: 'kg',
  barMass: IWF_MEN_BAR_KG,
  collarMass: IWF_COLLAR_KG,
  plates: competitionPairs(),
}

/** The same plates on the 15 kg bar. */
export const KG_COMPETITION_SET_15KG_BAR: BarbellEquipment = {
  ...KG_COMPETITION_SET,
  name: 'Kilogram competition set, 15 kg bar',
  barMass: IWF_WOMEN_BAR_KG,
  plates: competitionPairs(),
}

/**
 * A common commercial kilogram gym: a 20 kg bar, no collars counted (many lifters use spring
 * clips and do not weigh them; a gym that counts collars says so in its profile) and plates of
 * 25, 20, 15, 10, 5, 2.5 and 1.25 kg, the 1.25 kg pair making a 2.5 kg step on the bar.
 * The plate sizes and pair counts are common practice, no published source.
 */
export const KG_GYM_SET: BarbellEquipment = {
  kind: 'barbell',
  name: 'Kilogram gym set, 20 kg bar',
  unit: 'kg',
  barMass: IWF_MEN_BAR_KG,
  collarMass: 0,
  plates: [
    { mass: 25, count: 6 },
    { mass: 20, count: 2 },
    { mass: 15, count: 2 },
    { mass: 10, count: 2 },
    { mass: 5, count: 2 },
    { mass: 2.5, count: 2 },
    { mass: 1.25, count: 2 },
  ],
}

/**
 * A common pound gym: 45 lb bar; 45, 35, 25, 10, 5 and 2.5 lb plates; no collars counted.
 * Common practice, no standards body. (Many "45 lb" bars are really 20 kg = 44.09 lb.)
 */
export const LB_GYM_SET: BarbellEquipment = {
  kind: 'barbell',
  name: 'Pound gym set, 45 lb bar',
  unit: 'lb',
  barMass: 45,
  collarMass: 0,
  plates: [
    { mass: 45, count: 6 },
    { mass: 35, count: 1 },
    { mass: 25, count: 2 },
    { mass: 10, count: 2 },
    { mass: 5, count: 2 },
    { mass: 2.5, count: 1 },
  ],
}

// ---------------------------------------------------------------------------------------------
// Compiled form: every load an equipment profile can make, on an integer grid (grid units).

/** Grid units per unit of mass: loads are resolved to a millionth of a kg or lb. */
export const GRID = 1_000_000
const toGrid = (value: number): number => Math.round(snap(value) * GRID)
const fromGrid = (grid: number): number => grid / GRID

interface PlateKind {
  grid: number
  perSide: number
}

/** Internal, cached per profile object. Treat equipment profiles as immutable values. */
export interface CompiledEquipment {
  readonly equipment: Equipment
  readonly unit: Unit
  /** Sorted loads (grid units), or null for the unbounded 'any' kind. */
  readonly menu: number[] | null
  readonly minGrid: number
  readonly maxGrid: number
  /** Smallest difference between two loadable loads (grid units). */
  readonly minIncrementGrid: number
  // barbell only
  readonly baseGrid: number
  readonly plateKinds: PlateKind[]
  /** reach[j]: per-side sums possible with plate kinds j.. (for plate-list search). */
  readonly reach: Set<number>[]
  // 'any' only
  readonly stepGrid: number
  /** Memo: usual (heaviest-first) plate list per side by load, in the equipment unit. */
  readonly perSideMemo: Map<number, readonly number[]>
}

const cache = new WeakMap<object, CompiledEquipment>()

/** Validates a profile once and precomputes its loads. Throws EngineError on a bad profile. */
export function compileEquipment(equipment: Equipment): CompiledEquipment {
  if (typeof equipment === 'object' && equipment !== null) {
    const hit = cache.get(equipment)
    if (hit) return hit
  }
  const kind = (equipment as { kind?: unknown } | null)?.kind
  if (!EQUIPMENT_KINDS.includes(kind as EquipmentKind)) {
    throw new EngineError('UNKNOWN_EQUIPMENT_KIND', `Unknown equipment kind: ${String(kind)}`, {
      kind,
      known: EQUIPMENT_KINDS,
    })
  }
  const parsed = equipmentSchema.safeParse(equipment)
  if (!parsed.success) {
    throw new EngineError('INVALID_EQUIPMENT', `Invalid ${String(kind)} profile`, {
      issues: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
    })
  }
  const compiled = build(parsed.data)
  cache.set(equipment, compiled)
  return compiled
}

/** All sums of a bounded multiset of weights (0 included), as a sorted array. */
function subsetSums(stock: { grid: number; count: number }[]): number[] {
  let sums = new Set<number>([0])
  for (const { grid, count } of stock) {
    const next = new Set<number>()
    for (const s of sums) for (let c = 0; c <= count; c++) next.add(s + c * grid)
    sums = next
  }
  return [...sums].sort((a, b) => a - b)
}

function minGap(sorted: number[]): number {
  let gap = Infinity
  for (let i = 1; i < sorted.length; i++) gap = Math.min(gap, sorted[i] - sorted[i - 1])
  return gap
}

function build(eq: Equipment): CompiledEquipment {
  const base = {
    equipment: eq,
    unit: eq.unit,
    baseGrid: 0,
    plateKinds: [] as PlateKind[],
    reach: [] as Set<number>[],
    stepGrid: 0,
    perSideMemo: new Map<number, readonly number[]>(),
  }
  const fromMenu = (menu: number[]): CompiledEquipment => ({
    ...base,
    menu,
    minGrid: menu[0],
    maxGrid: menu[menu.length - 1],
    minIncrementGrid: minGap(menu),
  })
  switch (eq.kind) {
    case 'barbell': {
      // Merge duplicate masses, heaviest first (heaviest discs go on first, IWF [from memory]).
      const byMass = new Map<number, number>()
      for (const p of eq.plates) byMass.set(toGrid(p.mass), (byMass.get(toGrid(p.mass)) ?? 0) + p.count)
      const plateKinds = [...byMass]
        .filter(([, n]) => n > 0)
        .map(([grid, perSide]) => ({ grid, perSide }))
        .sort((a, b) => b.grid - a.grid)
      const reach: Set<number>[] = new Array(plateKinds.length + 1)
      reach[plateKinds.length] = new Set([0])
      for (let j = plateKinds.length - 1; j >= 0; j--) {
        const next = new Set<number>()
        const { grid, perSide } = plateKinds[j]
        for (const s of reach[j + 1]) for (let c = 0; c <= perSide; c++) next.add(s + c * grid)
        reach[j] = next
      }
      const baseGrid = toGrid(eq.barMass + 2 * eq.collarMass)
      const menu = [...reach[0]].sort((a, b) => a - b).map((s) => baseGrid + 2 * s)
      return { ...fromMenu(menu), baseGrid, plateKinds, reach }
    }
    case 'dumbbell':
      return fromMenu([...new Set(eq.pairs.map(toGrid))].sort((a, b) => a - b))
    case 'stack': {
      const adds = subsetSums(eq.addOns.map((a) => ({ grid: toGrid(a.mass), count: a.count })))
      const all = new Set<number>()
      for (const s of eq.steps) for (const a of adds) all.add(toGrid(s) + a)
      return fromMenu([...all].sort((a, b) => a - b))
    }
    case 'bodyweight':
      return fromMenu(subsetSums(eq.added.map((a) => ({ grid: toGrid(a.mass), count: a.count }))))
    case 'any': {
      const stepGrid = toGrid(eq.step)
      const minGrid = toGrid(eq.min)
      const maxGrid =
        eq.max === undefined ? Number.MAX_SAFE_INTEGER : minGrid + Math.floor((toGrid(eq.max) - minGrid) / stepGrid) * stepGrid
      return { ...base, menu: null, minGrid, maxGrid, minIncrementGrid: stepGrid, stepGrid }
    }
  }
}

// ---------------------------------------------------------------------------------------------
// Grid queries (grid units of the equipment unit). Exported for the other engine modules.

/** Largest loadable load <= grid, or null. */
export function atOrBelowGrid(c: CompiledEquipment, grid: number): number | null {
  if (grid < c.minGrid) return null
  if (c.menu === null) {
    return Math.min(c.maxGrid, c.minGrid + Math.floor((grid - c.minGrid) / c.stepGrid) * c.stepGrid)
  }
  const m = c.menu
  let lo = 0
  let hi = m.length - 1
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1
    if (m[mid] <= grid) lo = mid
    else hi = mid - 1
  }
  return m[lo]
}

/** Smallest loadable load >= grid, or null. */
export function atOrAboveGrid(c: CompiledEquipment, grid: number): number | null {
  if (grid > c.maxGrid) return null
  if (c.menu === null) {
    if (grid <= c.minGrid) return c.minGrid
    return c.minGrid + Math.ceil((grid - c.minGrid) / c.stepGrid) * c.stepGrid
  }
  const m = c.menu
  let lo = 0
  let hi = m.length - 1
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (m[mid] >= grid) hi = mid
    else lo = mid + 1
  }
  return m[lo]
}

/** Loadable loads strictly between lo and hi (grid), nearest to `centre` first, at most k. */
export function candidatesNear(c: CompiledEquipment, centre: number, lo: number, hi: number, k: number): number[] {
  const out: number[] = []
  let down = atOrBelowGrid(c, Math.min(centre, hi - 1))
  let up = down === null ? atOrAboveGrid(c, lo + 1) : atOrAboveGrid(c, down + 1)
  while (out.length < k) {
    const downOk = down !== null && down > lo
    const upOk = up !== null && up < hi
    if (!downOk && !upOk) break
    if (downOk && (!upOk || centre - down! <= up! - centre)) {
      out.push(down!)
      down = atOrBelowGrid(c, down! - 1)
    } else {
      out.push(up!)
      up = atOrAboveGrid(c, up! + 1)
    }
  }
  return out
}

/**
 * Per-side plate lists (heaviest, i.e. innermost, first) that make `perSideGrid` with the
 * plates on hand. Depth-first from the heaviest plate, so the first list is the usual
 * heaviest-first loading; at most `limit` lists.
 */
export function perSideOptionsGrid(c: CompiledEquipment, perSideGrid: number, limit: number): number[][] {
  const out: number[][] = []
  if (!c.reach.length || !c.reach[0].has(perSideGrid)) return out
  const stack: number[] = []
  const dfs = (j: number, rest: number): void => {
    if (out.length >= limit) return
    if (rest === 0) {
      out.push(stack.slice())
      return
    }
    if (j >= c.plateKinds.length) return
    const { grid, perSide } = c.plateKinds[j]
    for (let n = Math.min(perSide, Math.floor(rest / grid)); n >= 0 && out.length < limit; n--) {
      const after = rest - n * grid
      if (!c.reach[j + 1].has(after)) continue
      for (let i = 0; i < n; i++) stack.push(grid)
      dfs(j + 1, after)
      stack.length -= n
    }
  }
  dfs(0, perSideGrid)
  return out
}

// ---------------------------------------------------------------------------------------------
// Public API (kilograms in, kilograms plus equipment unit out).

export interface LoadOption {
  /** Full-precision kilograms, as stored. */
  loadKg: number
  /** The same load in the equipment's unit (what the lifter loads). */
  load: number
  unit: Unit
  /** Barbell only: plates on ONE side, innermost (heaviest) first (shared, frozen: copy to edit). */
  perSide?: readonly number[]
}

export interface Loadability {
  targetKg: number
  /** Target in the equipment unit. */
  target: number
  unit: Unit
  /** True when the target itself can be loaded. */
  exact: boolean
  /** Nearest load at or below the target. */
  below: LoadOption
  /** Nearest load at or above the target. */
  above: LoadOption
  /** The closer of the two (ties go below: never load more than asked). */
  nearest: LoadOption
  /** Smallest jump between two loads this equipment can make, in its unit. */
  minIncrement: number
}

export function optionFromGrid(c: CompiledEquipment, grid: number): LoadOption {
  const load = fromGrid(grid)
  const option: LoadOption = { loadKg: toKg(load, c.unit), load, unit: c.unit }
  if (c.equipment.kind === 'barbell') {
    let plates = c.perSideMemo.get(grid)
    if (!plates) {
      plates = Object.freeze((perSideOptionsGrid(c, (grid - c.baseGrid) / 2, 1)[0] ?? []).map(fromGrid))
      c.perSideMemo.set(grid, plates)
    }
    option.perSide = plates
  }
  return option
}

/** Kilograms to the equipment's grid (grid units of its unit). */
export function kgToGrid(c: CompiledEquipment, kg: number): number {
  return toGrid(fromKg(kg, c.unit))
}

/**
 * The nearest loads the equipment can make at or below and at or above `targetKg`, with plates
 * per side for a barbell, respecting how many of each plate exist.
 * Throws TARGET_BELOW_MINIMUM (e.g. below the empty bar), NOT_ENOUGH_PLATES (barbell) or
 * TARGET_ABOVE_MAXIMUM (other kinds).
 */
export function loadable(targetKg: number, equipment: Equipment): Loadability {
  assertLoad(targetKg, 'target')
  const c = compileEquipment(equipment)
  const target = fromKg(targetKg, c.unit)
  const grid = toGrid(target)
  if (grid < c.minGrid) {
    const what = equipment.kind === 'barbell' ? 'the empty bar' : 'the lightest load available'
    throw new EngineError('TARGET_BELOW_MINIMUM', `${target} ${c.unit} is below ${what} (${fromGrid(c.minGrid)} ${c.unit})`, {
      target,
      minimum: fromGrid(c.minGrid),
      unit: c.unit,
    })
  }
  if (grid > c.maxGrid) {
    const barbell = equipment.kind === 'barbell'
    throw new EngineError(
      barbell ? 'NOT_ENOUGH_PLATES' : 'TARGET_ABOVE_MAXIMUM',
      `${target} ${c.unit} is above the heaviest load ${barbell ? 'the plates on hand make' : 'available'} (${fromGrid(c.maxGrid)} ${c.unit})`,
      { target, maximum: fromGrid(c.maxGrid), unit: c.unit },
    )
  }
  const belowGrid = atOrBelowGrid(c, grid)!
  const aboveGrid = atOrAboveGrid(c, grid)!
  const below = optionFromGrid(c, belowGrid)
  const above = aboveGrid === belowGrid ? below : optionFromGrid(c, aboveGrid)
  return {
    targetKg,
    target,
    unit: c.unit,
    exact: belowGrid === grid,
    below,
    above,
    nearest: grid - belowGrid <= aboveGrid - grid ? below : above,
    minIncrement: fromGrid(c.minIncrementGrid),
  }
}

/** True when the equipment can make exactly this load (to 1/1,000,000 of its unit). */
export function isLoadable(loadKg: number, equipment: Equipment): boolean {
  const c = compileEquipment(equipment)
  const grid = kgToGrid(c, loadKg)
  return atOrBelowGrid(c, grid) === grid
}

/** Plates on one side of the bar for a loadable barbell load, heaviest (innermost) first. */
export function platesPerSide(loadKg: number, equipment: Equipment): readonly number[] {
  const result = loadable(loadKg, equipment)
  if (!result.exact) {
    throw new EngineError('NOT_ENOUGH_PLATES', `${result.target} ${result.unit} cannot be made with these plates`, {
      target: result.target,
      below: result.below.load,
      above: result.above.load,
    })
  }
  return result.below.perSide ?? []
}

/** The smallest load this equipment can make (the empty bar, lightest dumbbell...). */
export function minimumLoad(equipment: Equipment): LoadOption {
  const c = compileEquipment(equipment)
  return optionFromGrid(c, c.minGrid)
}

/** Smallest jump between two loads the equipment can make, in its own unit and in kg. */
export function minIncrement(equipment: Equipment): { value: number; unit: Unit; kg: number } {
  const c = compileEquipment(equipment)
  const value = fromGrid(c.minIncrementGrid)
  return { value, unit: c.unit, kg: toKg(value, c.unit) }
}

/** The lightest loadable load strictly heavier than `loadKg`, or null at the top of the inventory. */
export function stepUp(loadKg: number, equipment: Equipment): LoadOption | null {
  const c = compileEquipment(equipment)
  const next = atOrAboveGrid(c, kgToGrid(c, loadKg) + 1)
  return next === null ? null : optionFromGrid(c, next)
}

/** The heaviest loadable load strictly lighter than `loadKg`, or null. */
export function stepDown(loadKg: number, equipment: Equipment): LoadOption | null {
  const c = compileEquipment(equipment)
  const prev = atOrBelowGrid(c, kgToGrid(c, loadKg) - 1)
  return prev === null ? null : optionFromGrid(c, prev)
}

/** Loadable load at or below `loadKg`, falling back to the lightest load (never throws on range). */
export function roundDownToLoadable(loadKg: number, equipment: Equipment): LoadOption {
  const c = compileEquipment(equipment)
  const grid = Math.min(kgToGrid(c, loadKg), c.maxGrid)
  return optionFromGrid(c, atOrBelowGrid(c, grid) ?? c.minGrid)
}
