/**
 * Warm-up ramps: how many warm-up sets an exercise gets (`warmupSetsFor`) and which loads,
 * reps and plate changes they are (`warmupRamp`).
 *
 * Shape after the NSCA 1RM-testing warm-up (Baechle & Earle (eds.), Essentials of Strength
 * Training and Conditioning, 3rd ed., 2008; secondary copy): a light load for 5-10 reps, loads
 * rising in steps of about 5-10 % (upper body) or 10-20 % (lower body) for 3-5 reps, a
 * near-maximal load for 2-3 reps; ACSM Guidelines for Exercise Testing and Prescription
 * (secondary copy): start near 50-70 % of the maximum. Empty bar first on barbell lifts: common
 * practice. The exact counts, percentages and rep numbers below are common practice, no
 * published source.
 *
 * Barbell ramps are plate-economical: among the loads within RAMP_TOLERANCE_POINTS of each
 * ideal percentage, and every way to make each of them per side in the usual order (heaviest
 * innermost), the ramp with the fewest plate moves per side from the bare bar to the working
 * set is chosen, exactly (layered dynamic programming).
 */
import {
  atOrAboveGrid,
  atOrBelowGrid,
  compileEquipment,
  GRID,
  kgToGrid,
  loadable,
  minimumLoad,
  perSideOptionsGrid,
  type CompiledEquipment,
  type Equipment,
  type LoadOption,
} from './equipment'
import { EngineError, assertLoad } from './errors'
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
  /**
   * Warm-up sets: on a barbell they include the empty bar, except on a shortened ramp, which
   * has none. Default: `warmupSetsFor` for a compound lift.
   */
  sets?: number
  /** The movement pattern was already warmed up this session: only the upper part of the ramp. */
  shortened?: boolean
  /** 'optimised' (default): fewest plate moves; 'nearest': each ideal load rounded on its own. */
  strategy?: RampStrategy
}

// ---------------------------------------------------------------------------------------------
// The rules (common practice, no published source, unless a comment says otherwise).

/** Most warm-up sets a ramp has (the set scheme allows 1 to 5). */
export const MAX_WARMUP_SETS = 5

/**
 * Ideal loads, in percent of the working load, for k climbing sets (above the empty bar or the
 * lightest load). A single warm-up and short ramps start inside ACSM's 50-70 %; longer ramps,
 * for heavier loads, start lighter (NSCA: a light load first) and end near 80-87.5 %, the
 * near-maximal set before the working set. Steps of 12.5-25 points sit within or just above
 * NSCA's 5-20 % so a ramp stays short.
 */
export const RAMP_IDEAL_PERCENTS: Readonly<Record<number, readonly number[]>> = {
  1: [60],
  2: [50, 75],
  3: [40, 60, 80],
  4: [40, 55, 70, 85],
  5: [35, 50, 62.5, 75, 87.5],
}

/**
 * A barbell warm-up may sit up to this many percentage points of the working load from its
 * ideal. Half of NSCA's largest warm-up step (20 %): the ideal is a shape, not a prescription,
 * and the slack lets the ramp use whole heavy plates (135/225/315 lb before 405 lb). The
 * loads still rise strictly, by MIN_STEP_PERCENT at least.
 */
export const RAMP_TOLERANCE_POINTS = 10

/** Consecutive warm-ups differ by at least this percent of the working load: smaller steps warm nothing. */
export const MIN_STEP_PERCENT = 4

/**
 * "Well above" the lightest load (empty bar, lightest dumbbell, no added load): the working load
 * exceeds it by at least WELL_ABOVE_KG and by at least WELL_ABOVE_FRACTION of the working
 * load. Below that a warm-up set would be all but the working set itself.
 */
export const WELL_ABOVE_KG = 10
export const WELL_ABOVE_FRACTION = 0.25

/**
 * Climbing warm-up sets (above the empty bar or the lightest load) for a full ramp: one below
 * 45 kg, two below 100 kg, three below 200 kg, four from 200 kg.
 */
export function warmupStepsAbove(workingKg: number): number {
  if (workingKg < 45) return 1
  if (workingKg < 100) return 2
  if (workingKg < 200) return 3
  return 4
}

/** Climbing sets of a shortened ramp with `fullSteps` in the full one: the upper half, at least one. */
export function shortenedSteps(fullSteps: number): number {
  return Math.max(1, Math.ceil(fullSteps / 2))
}

/** True when the working load is well above the equipment's lightest load (see WELL_ABOVE_KG). */
export function isWellAboveLightest(workingKg: number, equipment: Equipment): boolean {
  const gap = workingKg - minimumLoad(equipment).loadKg
  const eps = 1e-9
  return gap >= WELL_ABOVE_KG - eps && gap >= WELL_ABOVE_FRACTION * workingKg - eps
}

export interface WarmupPolicyInput {
  /** The heaviest working load of the exercise today. */
  workingKg: number
  equipment: Equipment
  /** A multi-joint exercise (press, squat, row, hinge, chin-up...). */
  compound: boolean
  /** The same movement pattern was already warmed up earlier in this session. */
  shortened?: boolean
  /** The coach's fixed number of warm-up sets; wins when given. */
  fixedSets?: number | null
}

/**
 * How many warm-up sets an exercise gets; 0 means no ramp. Every barbell exercise and every
 * compound exercise gets a ramp when its working load is well above the empty bar or the
 * lightest load. Barbell: the empty bar plus `warmupStepsAbove` sets; other equipment: those
 * sets only. Shortened: the upper half of the climbing sets, no empty bar, at least one.
 */
export function warmupSetsFor(input: WarmupPolicyInput): number {
  if (input.fixedSets !== undefined && input.fixedSets !== null) {
    checkSetCount(input.fixedSets)
    return input.fixedSets
  }
  assertLoad(input.workingKg, 'working load')
  const barbell = input.equipment.kind === 'barbell'
  if (!barbell && !input.compound) return 0
  if (!isWellAboveLightest(input.workingKg, input.equipment)) return 0
  const above = warmupStepsAbove(input.workingKg)
  if (input.shortened) return shortenedSteps(above)
  return barbell ? above + 1 : above
}

function checkSetCount(sets: number): void {
  if (!Number.isInteger(sets) || sets < 0 || sets > MAX_WARMUP_SETS) {
    throw new EngineError('INVALID_SCHEME', `Warm-up sets must be a whole number from 0 to ${MAX_WARMUP_SETS} (got ${sets})`, {
      sets,
    })
  }
}

/**
 * Ideal percents for `steps` climbing sets. A shortened ramp keeps the top `steps` of the full
 * ramp for this working load (or of a ramp that long, if the coach asked for more).
 */
export function rampIdealPercents(workingKg: number, steps: number, shortened: boolean): readonly number[] {
  if (steps <= 0) return []
  const full = shortened ? Math.max(steps, warmupStepsAbove(workingKg)) : steps
  return RAMP_IDEAL_PERCENTS[full].slice(full - steps)
}

/** The last warm-up before the working set sits near this percent of it when the bar itself is a large share. */
const TOP_OF_RAMP_PERCENT = 85
/** A first climbing set closer than this to the empty bar (percentage points) warms nothing the bar did not. */
const MIN_POINTS_ABOVE_BAR = 15

/**
 * When the empty bar is already a large share of the working load (a 45 lb bar under 100 lb), the
 * ideals are spread evenly between the bar and TOP_OF_RAMP_PERCENT instead, so the first climbing
 * set is not the bar with a small plate on.
 */
export function spreadAboveBar(ideals: readonly number[], barPercent: number): readonly number[] {
  if (ideals.length === 0 || ideals[0] >= barPercent + MIN_POINTS_ABOVE_BAR) return ideals
  const k = ideals.length
  return ideals.map((_, i) => barPercent + ((TOP_OF_RAMP_PERCENT - barPercent) * (i + 1)) / k)
}

/**
 * Reps by load (percent of the working load): 6 below 45 %, 5 below 60 %, 4 below 70 %, 3
 * below 80 %, else 2 — NSCA's light 5-10, rising 3-5 and near-maximal 2-3. The empty bar is 6.
 * Loads rise, so reps never do.
 */
function repsFor(grid: number, workingGrid: number, emptyBar: boolean): number {
  if (emptyBar) return 6
  const pct = (p: number): boolean => 100 * grid < p * workingGrid
  if (pct(45)) return 6
  if (pct(60)) return 5
  if (pct(70)) return 4
  if (pct(80)) return 3
  return 2
}

// ---------------------------------------------------------------------------------------------
// Plate moves.

export function plateChange(from: readonly number[], to: readonly number[]): PlateChange {
  const p = commonPrefix(from, to)
  const remove = from.slice(p).reverse()
  const add = to.slice(p)
  return { remove, add, count: remove.length + add.length }
}

function commonPrefix(a: readonly number[], b: readonly number[]): number {
  let p = 0
  while (p < a.length && p < b.length && a[p] === b[p]) p++
  return p
}

/** Plates are a stack: everything above the first difference comes off, then the new ones go on. */
function moves(a: readonly number[], b: readonly number[]): number {
  return a.length + b.length - 2 * commonPrefix(a, b)
}

// ---------------------------------------------------------------------------------------------
// The search.

interface Node {
  grid: number
  /** Per side, grid units, innermost first. */
  plates: number[]
  /** Smallest load (grid) a following warm-up may have, minus this load. */
  gapAfter: number
  /** |load - ideal| x 1000 (integer, grid units x 1000). */
  distance: number
  // best path ending here
  kept: number
  moves: number
  totalDistance: number
  prev: Node | null
}

const node = (grid: number, plates: number[], gapAfter: number, distance = 0): Node => ({
  grid,
  plates,
  gapAfter,
  distance,
  kept: 0,
  moves: 0,
  totalDistance: 0,
  prev: null,
})

/** Keeping a step outweighs any number of plate moves: a step is dropped only when it cannot be kept. */
const KEEP_WEIGHT = 1_000_000

/**
 * Best path ending at one of the inserted nodes, for a node with plates b: minimises
 * (-kept, moves + moves(a, b), totalDistance). Each cell on the path of a's plates holds the
 * best (moves - KEEP_WEIGHT x kept + |a|, totalDistance) below it; moves(a, b) = |a| + |b| - 2l
 * for the deepest shared cell l, and a shallower cell only overestimates.
 */
class PrefixTree {
  private readonly root = new Cell()

  insert(a: Node): void {
    const key = a.moves - KEEP_WEIGHT * a.kept + a.plates.length
    let cell = this.root
    cell.offer(key, a.totalDistance, a)
    for (const plate of a.plates) {
      let next = cell.children.get(plate)
      if (!next) cell.children.set(plate, (next = new Cell()))
      cell = next
      cell.offer(key, a.totalDistance, a)
    }
  }

  best(plates: readonly number[]): Node | null {
    let cell: Cell | undefined = this.root
    let best: Node | null = null
    let bestKey = Infinity
    let bestDistance = Infinity
    for (let depth = 0; cell; depth++) {
      if (cell.node) {
        const key = cell.key - 2 * depth + plates.length
        if (key < bestKey || (key === bestKey && cell.distance < bestDistance)) {
          bestKey = key
          bestDistance = cell.distance
          best = cell.node
        }
      }
      cell = depth < plates.length ? cell.children.get(plates[depth]) : undefined
    }
    return best
  }
}

class Cell {
  key = Infinity
  distance = Infinity
  node: Node | null = null
  readonly children = new Map<number, Cell>()
  offer(key: number, distance: number, n: Node): void {
    if (key < this.key || (key === this.key && distance < this.distance)) {
      this.key = key
      this.distance = distance
      this.node = n
    }
  }
}

/**
 * Layered dynamic programming: layer i holds the nodes of warm-up step i; a step may be left
 * out (its nodes simply stay unused). Every node takes the best earlier node (or the start)
 * at least its gap below it. Returns the best path's nodes and the working node's predecessor.
 */
function bestPath(start: Node, layers: Node[][], working: readonly number[]): Node[] {
  const done: Node[] = [start]
  for (const layer of layers) {
    const ready = [...done].sort((a, b) => a.grid + a.gapAfter - (b.grid + b.gapAfter))
    const tree = new PrefixTree()
    let r = 0
    const reached: Node[] = []
    for (const n of [...layer].sort((a, b) => a.grid - b.grid)) {
      while (r < ready.length && ready[r].grid + ready[r].gapAfter <= n.grid) tree.insert(ready[r++])
      const prev = tree.best(n.plates)
      if (!prev) continue
      n.prev = prev
      n.kept = prev.kept + 1
      n.moves = prev.moves + moves(prev.plates, n.plates)
      n.totalDistance = prev.totalDistance + n.distance
      reached.push(n)
    }
    done.push(...reached)
  }
  const tree = new PrefixTree()
  for (const n of done) tree.insert(n)
  const path: Node[] = []
  for (let n = tree.best(working); n && n !== start; n = n.prev) path.unshift(n)
  return path
}

const totalMoves = (path: readonly Node[], working: readonly number[]): number =>
  path.length ? path[path.length - 1].moves + moves(path[path.length - 1].plates, working) : working.length

/** Loadable loads in [lo, hi] (grid), ascending. */
function loadsBetween(c: CompiledEquipment, lo: number, hi: number): number[] {
  const out: number[] = []
  for (let g = atOrAboveGrid(c, lo); g !== null && g <= hi; g = atOrAboveGrid(c, g + 1)) out.push(g)
  return out
}

/**
 * Every per-side plate list (non-increasing, within the inventory) making `perSide`, except
 * those that cannot be on a ramp of at most `bound` moves: reaching b from the bare bar and
 * going on to the working list w costs at least |b| + moves(b, w).
 */
function plateLists(c: CompiledEquipment, perSide: number, working: readonly number[], bound: number): number[][] {
  const out: number[][] = []
  if (!c.reach[0].has(perSide)) return out
  const stack: number[] = []
  // diverged: first position where the list left the working list's prefix, or -1
  const dfs = (j: number, rest: number, diverged: number): void => {
    if (diverged >= 0 && 2 * stack.length - 2 * diverged + working.length > bound) return
    if (rest === 0) {
      if (stack.length + moves(stack, working) <= bound) out.push(stack.slice())
      return
    }
    if (j >= c.plateKinds.length) return
    const { grid, perSide: have } = c.plateKinds[j]
    for (let n = Math.min(have, Math.floor(rest / grid)); n >= 0; n--) {
      const after = rest - n * grid
      if (!c.reach[j + 1].has(after)) continue
      let d = diverged
      for (let i = 0; i < n; i++) {
        if (d < 0 && working[stack.length] !== grid) d = stack.length
        stack.push(grid)
      }
      dfs(j + 1, after, d)
      stack.length -= n
    }
  }
  dfs(0, perSide, -1)
  return out
}

interface Step {
  /** Ideal load x 1000 (grid units x 1000): exact integer arithmetic. */
  ideal1000: number
  loads: number[]
}

/** The fewest-plate-moves barbell ramp (see the file comment). */
function optimisedBarbell(c: CompiledEquipment, start: Node, steps: Step[], gap: number, working: number[]): Node[] {
  const perSide = (g: number): number => (g - c.baseGrid) / 2
  const layer = (lists: (g: number) => number[][]): Node[][] =>
    steps.map((s) =>
      s.loads.flatMap((g) => lists(g).map((plates) => node(g, plates, gap, Math.abs(1000 * g - s.ideal1000)))),
    )
  // One way per load (heaviest first) already keeps the most steps; its moves bound the exact search.
  const heaviestFirst = (g: number): number[][] => perSideOptionsGrid(c, perSide(g), 1)
  const first = bestPath(start, layer(heaviestFirst), working)
  const bound = totalMoves(first, working)
  return bestPath(start, layer((g) => plateLists(c, perSide(g), working, bound)), working)
}

/** Each ideal load rounded on its own to the nearest load that keeps the ramp rising. */
function nearestLoads(c: CompiledEquipment, start: Node, ideals1000: number[], W: number, gap: number): number[] {
  const out: number[] = []
  let floor = start.grid + start.gapAfter
  for (const ideal1000 of ideals1000) {
    let down = atOrBelowGrid(c, Math.min(Math.floor(ideal1000 / 1000), W - 1))
    if (down !== null && down < floor) down = null
    let up = atOrAboveGrid(c, Math.max(Math.ceil(ideal1000 / 1000), floor))
    if (up !== null && up >= W) up = null
    if (down === null && up === null) continue
    const g = up === null || (down !== null && ideal1000 - 1000 * down <= 1000 * up - ideal1000) ? down! : up
    out.push(g)
    floor = g + gap
  }
  return out
}

/**
 * The warm-up ramp for a working load (kg). Barbell: the empty bar first (not on a shortened
 * ramp), then climbing loads, each loadable, strictly heavier than the one before by
 * MIN_STEP_PERCENT of the working load and lighter than the working load, with the per-side
 * plate changes for every step. Other equipment: climbing loads only, each the nearest
 * loadable load to its ideal. A step with no usable load is dropped, never repeated.
 */
export function warmupRamp(workingKg: number, equipment: Equipment, options: WarmupOptions = {}): WarmupRamp {
  const c = compileEquipment(equipment)
  const isBar = equipment.kind === 'barbell'
  const shortened = options.shortened ?? false
  const W = kgToGrid(c, loadable(workingKg, equipment).below.loadKg)
  const requested = options.sets ?? warmupSetsFor({ workingKg, equipment, compound: true, shortened })
  checkSetCount(requested)
  const strategy = options.strategy ?? 'optimised'
  const gap = Math.max(1, Math.round((MIN_STEP_PERCENT * W) / 100))

  const workingPlates = isBar ? (perSideOptionsGrid(c, (W - c.baseGrid) / 2, 1)[0] ?? []) : []
  const liftsBar = isBar && !shortened && requested > 0 && c.minGrid < W
  // The bare bar (barbell) or just below the lightest load (other kinds); only lifted when liftsBar.
  const start = isBar ? node(c.minGrid, [], liftsBar ? gap : 1) : node(c.minGrid - 1, [], 1)
  const climbing = Math.max(0, requested - (liftsBar ? 1 : 0))
  const ideals1000 = spreadAboveBar(rampIdealPercents(workingKg, climbing, shortened), liftsBar ? (100 * c.minGrid) / W : 0)
    .map((p) => Math.round(p * 10) * W)

  let path: Node[]
  if (isBar && strategy === 'optimised') {
    const tolerance1000 = RAMP_TOLERANCE_POINTS * 10 * W
    const steps = ideals1000.map((ideal1000) => ({
      ideal1000,
      loads: loadsBetween(c, Math.max(Math.ceil((ideal1000 - tolerance1000) / 1000), c.minGrid + 1), Math.min(Math.floor((ideal1000 + tolerance1000) / 1000), W - 1)),
    }))
    path = optimisedBarbell(c, start, steps, gap, workingPlates)
  } else {
    const heaviestFirst = (g: number): number[] => (isBar ? perSideOptionsGrid(c, (g - c.baseGrid) / 2, 1)[0] : [])
    path = nearestLoads(c, start, ideals1000, W, gap).map((g) => node(g, heaviestFirst(g), gap))
  }
  if (liftsBar) path.unshift(start)

  const option = (grid: number, plates: readonly number[]): LoadOption => {
    const load = grid / GRID
    const o: LoadOption = { loadKg: toKg(load, c.unit), load, unit: c.unit }
    if (isBar) o.perSide = plates.map((m) => m / GRID)
    return o
  }
  const toUnits = (ch: PlateChange): PlateChange => ({
    remove: ch.remove.map((m) => m / GRID),
    add: ch.add.map((m) => m / GRID),
    count: ch.count,
  })
  let total = 0
  const sets: WarmupSet[] = path.map((n, i) => {
    const set: WarmupSet = {
      target: option(n.grid, n.plates),
      reps: repsFor(n.grid, W, liftsBar && i === 0),
      percentOfWorking: (100 * n.grid) / W,
    }
    if (isBar) {
      set.change = toUnits(plateChange(i === 0 ? [] : path[i - 1].plates, n.plates))
      total += set.change.count
    }
    return set
  })
  const ramp: WarmupRamp = { working: option(W, workingPlates), sets, totalPlateChanges: 0 }
  if (isBar) {
    ramp.changeToWorking = toUnits(plateChange(path.length ? path[path.length - 1].plates : [], workingPlates))
    total += ramp.changeToWorking.count
  }
  ramp.totalPlateChanges = total
  return ramp
}
