/**
 * The contract between `npm run bench` (tests/bench/run-all.ts) and its parts.
 *
 * Each part lives in its own module under tests/bench/ and exports
 * `run(ctx: BenchContext): Promise<BenchPart>`. The runner builds the app once, calls the
 * parts one after another (never in parallel: they would share the 2 cores), and writes
 * bench/report.md and bench/report.json from what they return.
 */

export interface BenchContext {
  /** Repository root (absolute). */
  root: string
  /** The production build made by `npm run build`: dist/client and dist/server/index.js. */
  distDir: string
  /** A scratch folder for this run (databases, Lighthouse reports...). */
  workDir: string
  /** Logical CPU cores of this machine, printed beside every figure. */
  cores: number
  /** Progress lines on stderr; the report gets only what a part returns. */
  log: (line: string) => void
}

export interface Budget {
  /** What is measured, e.g. "Train route first load, gzip JS". */
  name: string
  value: number
  /** The limit from the issue. */
  limit: number
  unit: string
  /** 'max': value must be ≤ limit (or < when strict). 'min': value must be ≥ limit. */
  kind: 'max' | 'min'
  strict?: boolean
  pass: boolean
}

export interface BenchPart {
  /** Section title in the report, e.g. "1. Page weight". */
  title: string
  /** The command that reproduces this section alone, if there is one. */
  command?: string
  /** Markdown body of the section (tables, notes). No top-level heading. */
  markdown: string
  /** Machine-readable figures for bench/report.json. */
  figures: Record<string, unknown>
  budgets: Budget[]
}

export function budget(b: Omit<Budget, 'pass'>): Budget {
  const pass =
    b.kind === 'max' ? (b.strict ? b.value < b.limit : b.value <= b.limit) : b.strict ? b.value > b.limit : b.value >= b.limit
  return { ...b, pass }
}

/** Median of a non-empty list of numbers. */
export function median(values: number[]): number {
  if (values.length === 0) throw new Error('median of nothing')
  const sorted = [...values].sort((a, b) => a - b)
  const mid = sorted.length >> 1
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}

/** Nearest-rank percentile of values already sorted ascending: the smallest with at least p % at or below it. */
export function percentileOfSorted(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return Number.NaN
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!
}
