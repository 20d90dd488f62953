/**
 * Warm-up ramps: from the working load and the equipment, loadable warm-up sets climbing from
 * the empty bar (barbell lifts) to about 85 % of the working load, reps falling from about 6
 * to 2, never at or above the working load.
 *
 * Shape after the NSCA 1RM-testing warm-up (Baechle & Earle, Essentials, 3rd ed.; secondary
 * copy): a light set of 5-10 reps, loads rising for 3-5 reps, a near-maximal set of 2-3; and
 * ACSM Guidelines for Exercise Testing and Prescription (start near 50-70 %). The exact
 * percentages, rep counts and step counts below are common practice, no published source.
 *
 * Plate-change economy: for a barbell the ramp is a shortest path over candidate loadable
 * loads AND the ways to make them (plate lists per side), costing distance from the ideal
 * percentage plus plate changes, so consecutive warm-ups preferably only add plates.
 */
import {
  GRID,
  atOrAboveGrid,
  atOrBelowGrid,
  candidatesNear,
  compileEquipment,
  kgToGrid,
  loadable,
  perSideOptionsGrid,
  type CompiledEquipment,
  type Equipment,
  type LoadOption,
} from './equipment'
import { EngineError } from './errors'
import { toKg } from './units'

/** Per-side plate moves between two consecutive barbell loads (inner plates stay on). */
export interface PlateChange {
  /** Plates taken off each side, outermost first. */
  remove: number[]
  /** Plates put on each side, innermost first. */
  add: number[]
  /** Plates moved per side: remove.length + add.length. */
  count: number
}

export interface WarmupSet {
  target: LoadOption
  reps: number
  /** Load as a percent of the working load. */
  percentOfWorking: number
  /** Barbell only: changes from the previous warm-up (the first: from the bare bar). */
  change?: PlateChange
}

export interface WarmupRamp {
  /** The working load the ramp leads to (rounded down to loadable), with its plate list. */
  working: LoadOption
  sets: WarmupSet[]
  /** Barbell only: changes from the last warm-up to the working set. */
  changeToWorking?: PlateChange
  /** Barbell only: per-side plate moves from the bare bar to the working set. */
  totalPlateChanges: number
}

export type RampStrategy = 'optimised' | 'nearest'

export interface WarmupOptions {
  /** Warm-up sets including the empty bar; default from the working load (warmupSetCount). */
  sets?: number
  /** 'optimised' (default): shortest path; 'nearest': round each ideal load on its own. */
  strategy?: RampStrategy
  /** Cost of one plate moved per side, in percentage points of deviation (default 1.5). */
  plateChangeWeight?: number
}

/**
 * Warm-up sets for a working load (kg): light 1-2, heavy 4-5. Common practice, no published
 * source. For a barbell the count includes the empty bar.
 */
export function warmupSetCount(workingKg: number): number {
  if (workingKg < 30) return 1
  if (workingKg < 60) return 2
  if (workingKg < 100) return 3
  if (workingKg < 150) return 4
  return 5
}

/** Reps per warm-up by ramp length: falling from about 6 to 2 (common practice). */
const REPS_BY_LENGTH: Readonly<Record<number, number[]>> = {
  1: [5],
  2: [5, 3],
  3: [6, 4, 2],
  4: [6, 5, 3, 2],
  5: [6, 5, 4, 3, 2],
}

/** Ideal fractions of the working load for k climbing steps (about 45 % up to about 85 %). */
const IDEAL_BY_STEPS: Readonly<Record<number, number[]>> = {
  1: [0.6],
  2: [0.5, 0.8],
  3: [0.45, 0.65, 0.85],
  4: [0.45, 0.6, 0.75, 0.875],
  5: [0.4, 0.55, 0.675, 0.775, 0.875],
}

const CANDIDATE_LOADS = 6
/** Consecutive warm-ups differ by at least 4 % of the working load: smaller steps warm nothing. */
const MIN_STEP_FRACTION = 0.04
const minGap = (workingGrid: number): number => Math.max(1, Math.round(MIN_STEP_FRACTION * workingGrid))

/**
 * Ideal fractions for k climbing steps. When the empty bar is already a large part of the
 * working load, the steps are spread between the bar and about 85 % instead.
 */
function idealFractions(k: number, barFraction: number): number[] {
  const table = IDEAL_BY_STEPS[k]
  if (barFraction < table[0]) return table
  const hi = 0.85
  return table.map((f, i) => Math.max(f, barFraction + ((hi - barFraction) * (i + 1)) / k))
}
const PLATE_LISTS_PER_LOAD = 6

export function plateChange(from: readonly number[], to: readonly number[]): PlateChange {
  let p = 0
  while (p < from.length && p < to.length && from[p] === to[p]) p++
  const remove = from.slice(p).reverse()
  const add = to.slice(p)
  return { remove, add, count: remove.length + add.length }
}

interface Node {
  grid: number
  plates: number[] // per side, grid units, innermost first
  cost: number
  prev: Node | null
}

function changeCount(a: number[], b: number[]): number {
  let p = 0
  while (p < a.length && p < b.length && a[p] === b[p]) p++
  return a.length - p + (b.length - p)
}

function nodesFor(c: CompiledEquipment, grid: number, isBar: boolean, limit: number): Node[] {
  if (!isBar) return [{ grid, plates: [], cost: 0, prev: null }]
  return perSideOptionsGrid(c, (grid - c.baseGrid) / 2, limit).map((plates) => ({ grid, plates, cost: 0, prev: null }))
}

/** Shortest path through one layer of nodes per warm-up step; null when no increasing path exists. */
function optimise(
  c: CompiledEquipment,
  isBar: boolean,
  start: Node | null,
  ideals: number[],
  workingGrid: number,
  weight: number,
): { steps: Node[]; working: Node } | null {
  const W = workingGrid
  const gap = minGap(W)
  let layer: Node[] = start ? [start] : []
  const lo = start ? start.grid : c.minGrid - 1
  for (let i = 0; i < ideals.length; i++) {
    const ideal = ideals[i] * W
    const loads = candidatesNear(c, Math.round(ideal), lo, W, CANDIDATE_LOADS)
    const next: Node[] = []
    for (const grid of loads) {
      const distance = (100 * Math.abs(grid - ideal)) / W
      for (const node of nodesFor(c, grid, isBar, PLATE_LISTS_PER_LOAD)) {
        let best: Node | null = null
        let bestCost = Infinity
        if (i === 0 && !start) {
          bestCost = 0
        } else {
          for (const p of layer) {
            if (grid - p.grid < gap) continue
            const cost = p.cost + weight * changeCount(p.plates, node.plates)
            if (cost < bestCost) {
              bestCost = cost
              best = p
            }
          }
        }
        if (bestCost === Infinity) continue
        node.cost = bestCost + distance
        node.prev = best
        next.push(node)
      }
    }
    if (!next.length) return null
    layer = next
  }
  // The working set is loaded the usual way (heaviest plates first), as `loadable` shows it.
  let bestWorking: Node | null = null
  const w = nodesFor(c, W, isBar, 1)[0]
  for (const p of layer) {
    const cost = p.cost + weight * changeCount(p.plates, w.plates)
    if (bestWorking === null || cost < bestWorking.cost) bestWorking = { ...w, cost, prev: p }
  }
  if (!bestWorking) return null
  const steps: Node[] = []
  for (let n = bestWorking.prev; n; n = n.prev) steps.unshift(n)
  return { steps, working: bestWorking }
}

/** Each ideal load rounded to the nearest loadable load on its own (the naive ramp). */
function nearest(c: CompiledEquipment, isBar: boolean, start: Node | null, ideals: number[], W: number) {
  const steps: Node[] = start ? [start] : []
  for (const f of ideals) {
    const ideal = f * W
    const floor = steps.length ? steps[steps.length - 1].grid + minGap(W) - 1 : c.minGrid - 1
    const down = atOrBelowGrid(c, Math.min(Math.round(ideal), W - 1))
    const up = atOrAboveGrid(c, Math.round(ideal))
    const options = [down, up].filter((m): m is number => m !== null && m > floor && m < W)
    if (!options.length) continue
    const grid = options.reduce((a, b) => (Math.abs(b - ideal) < Math.abs(a - ideal) ? b : a))
    steps.push(nodesFor(c, grid, isBar, 1)[0])
  }
  return { steps, working: nodesFor(c, W, isBar, 1)[0] }
}

/**
 * The warm-up ramp for a working load (kg). Barbell: the empty bar first, then climbing loads,
 * each loadable, each strictly heavier than the one before and lighter than the working load,
 * with the per-side plate changes for every step. Other equipment: climbing loads only.
 * Returns no sets when nothing lighter than the working load can be loaded.
 */
export function warmupRamp(workingKg: number, equipment: Equipment, options: WarmupOptions = {}): WarmupRamp {
  const c = compileEquipment(equipment)
  const isBar = equipment.kind === 'barbell'
  const workingGrid = kgToGrid(c, loadable(workingKg, equipment).below.loadKg)
  const requested = options.sets ?? warmupSetCount(workingKg)
  if (!Number.isInteger(requested) || requested < 0 || requested > 5) {
    throw new EngineError('INVALID_SCHEME', `Warm-up sets must be a whole number from 0 to 5 (got ${requested})`, {
      sets: requested,
    })
  }
  const weight = options.plateChangeWeight ?? 1.5
  const strategy = options.strategy ?? 'optimised'

  const bare: Node | null = isBar && c.minGrid < workingGrid ? { grid: c.minGrid, plates: [], cost: 0, prev: null } : null
  let path: { steps: Node[]; working: Node } | null = null
  if (requested > 0) {
    for (let k = requested - (bare ? 1 : 0); k >= 0 && !path; k--) {
      if (k === 0) {
        path = { steps: bare ? [bare] : [], working: nodesFor(c, workingGrid, isBar, 1)[0] }
        break
      }
      const ideals = idealFractions(k, bare ? bare.grid / workingGrid : 0)
      if (strategy === 'nearest') {
        path = nearest(c, isBar, bare, ideals, workingGrid)
      } else {
        const found = optimise(c, isBar, bare, ideals, workingGrid, weight)
        if (found) path = { steps: bare ? [bare, ...found.steps.slice(1)] : found.steps, working: found.working }
      }
    }
  }
  const steps = path?.steps ?? []
  const workingNode = path?.working ?? nodesFor(c, workingGrid, isBar, 1)[0]
  const reps = REPS_BY_LENGTH[steps.length] ?? []
  const option = (n: Node): LoadOption => {
    const load = n.grid / GRID
    const o: LoadOption = { loadKg: toKg(load, c.unit), load, unit: c.unit }
    if (isBar) o.perSide = n.plates.map((m) => m / GRID)
    return o
  }
  const toUnits = (ch: PlateChange): PlateChange => ({
    remove: ch.remove.map((m) => m / GRID),
    add: ch.add.map((m) => m / GRID),
    count: ch.count,
  })
  let total = 0
  const sets: WarmupSet[] = steps.map((n, i) => {
    const set: WarmupSet = { target: option(n), reps: reps[i], percentOfWorking: (100 * n.grid) / workingGrid }
    if (isBar) {
      set.change = toUnits(plateChange(i === 0 ? [] : steps[i - 1].plates, n.plates))
      total += set.change.count
    }
    return set
  })
  const ramp: WarmupRamp = { working: option(workingNode), sets, totalPlateChanges: 0 }
  if (isBar) {
    ramp.changeToWorking = toUnits(plateChange(steps.length ? steps[steps.length - 1].plates : [], workingNode.plates))
    total += ramp.changeToWorking.count
  }
  ramp.totalPlateChanges = total
  return ramp
}
