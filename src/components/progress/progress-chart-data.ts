import { displayLoad, formatLoad } from '@shared/domain/units'
import type { Progress } from '@shared/schemas/athlete.schema'
import type { Unit } from '@shared/schemas/common.schema'

/*
 * Pure builders from the API's Progress (kilograms, ISO dates) to what the charts draw and what
 * their hidden summaries say, in the viewer's unit. No chart.js here: the charts map these to
 * their own config, the tests check them without a canvas.
 */

export interface ChartPoint {
  /** Milliseconds since the epoch (a linear time axis without a date adapter). */
  x: number
  y: number
}

export interface LoadSeries {
  label: string
  points: ChartPoint[]
}

const shortDate = new Intl.DateTimeFormat('en', { day: 'numeric', month: 'short', timeZone: 'UTC' })

/** "23 Nov" for an ISO date or timestamp (read as UTC so a calendar date never shifts a day). */
export function formatShortDate(value: string | number): string {
  const ms = typeof value === 'number' ? value : Date.parse(value.length === 10 ? `${value}T00:00:00Z` : value)
  return Number.isNaN(ms) ? '—' : shortDate.format(new Date(ms))
}

const toMs = (date: string) => Date.parse(date.length === 10 ? `${date}T00:00:00Z` : date)

/** Axis title with the viewer's unit: "Estimated 1RM (lb)". */
export const loadAxisTitle = (what: string, unit: Unit) => `${what} (${unit})`

/** One line per exercise, oldest point first, values in the viewer's unit to one decimal. */
export function buildE1rmSeries(e1rm: Progress['e1rm'], unit: Unit): LoadSeries[] {
  return e1rm
    .filter((lift) => lift.points.length > 0)
    .map((lift) => ({
      label: lift.exercise,
      points: lift.points
        .map((p) => ({ x: toMs(p.date), y: displayLoad(p.e1rmKg, unit, 1) }))
        .sort((a, b) => a.x - b.x),
    }))
}

/** Body weight over time in the viewer's unit to one decimal. */
export function buildBodyWeightSeries(bodyWeight: Progress['bodyWeight'], unit: Unit): LoadSeries {
  return {
    label: 'Body weight',
    points: bodyWeight.map((e) => ({ x: toMs(e.date), y: displayLoad(e.weightKg, unit, 1) })).sort((a, b) => a.x - b.x),
  }
}

export interface WeeklySetsChart {
  /** The x axis: muscles the plan targets (most sets first), then the others trained (by name). */
  muscles: string[]
  /** The most recent weeks, oldest first; sets[i] belongs to muscles[i] (0 when none). */
  weeks: Array<{ weekStart: string; label: string; sets: number[] }>
  /** The plan's weekly target for muscles[i], or null when the plan asks nothing of it. */
  targets: Array<number | null>
}

/** Hard sets per muscle for the last `maxWeeks` weeks as bars, the plan's targets lined up with them. */
export function buildWeeklySetsChart(
  weeklySets: Progress['weeklySets'],
  planWeeklySets: Progress['planWeeklySets'],
  maxWeeks = 4,
): WeeklySetsChart {
  const target = new Map(planWeeklySets.map((t) => [t.muscle, t.sets]))
  const planned = [...planWeeklySets].sort((a, b) => b.sets - a.sets || a.muscle.localeCompare(b.muscle)).map((t) => t.muscle)
  const others = [...new Set(weeklySets.map((w) => w.muscle))].filter((m) => !target.has(m)).sort((a, b) => a.localeCompare(b))
  const muscles = [...planned, ...others]

  const weekStarts = [...new Set(weeklySets.map((w) => w.weekStart))].sort().slice(-maxWeeks)
  const weeks = weekStarts.map((weekStart) => {
    const inWeek = weeklySets.filter((w) => w.weekStart === weekStart)
    return {
      weekStart,
      label: `Week of ${formatShortDate(weekStart)}`,
      sets: muscles.map((m) => inWeek.filter((w) => w.muscle === m).reduce((sum, w) => sum + w.sets, 0)),
    }
  })
  return { muscles, weeks, targets: muscles.map((m) => target.get(m) ?? null) }
}

/* Summaries for screen readers (and the tables behind each chart). */

export interface SummaryRow {
  label: string
  value: string
  note: string
}

/** Latest estimated 1RM per exercise and its change since the first point shown. */
export function summarizeE1rm(e1rm: Progress['e1rm'], unit: Unit): SummaryRow[] {
  return e1rm
    .filter((lift) => lift.points.length > 0)
    .map((lift) => {
      const sorted = [...lift.points].sort((a, b) => toMs(a.date) - toMs(b.date))
      const first = sorted[0]!
      const last = sorted.at(-1)!
      const change = displayLoad(last.e1rmKg, unit, 1) - displayLoad(first.e1rmKg, unit, 1)
      const sign = change > 0 ? '+' : change < 0 ? '−' : '±'
      return {
        label: lift.exercise,
        value: formatLoad(last.e1rmKg, unit, 1),
        note: `${sign}${Math.round(Math.abs(change) * 10) / 10} ${unit} since ${formatShortDate(first.date)} (${formatShortDate(last.date)})`,
      }
    })
}

/** The latest week's hard sets per muscle against the plan's target. */
export function summarizeWeeklySets(chart: WeeklySetsChart): SummaryRow[] {
  const latest = chart.weeks.at(-1)
  return chart.muscles.map((muscle, i) => ({
    label: muscle,
    value: `${latest?.sets[i] ?? 0} sets`,
    note: chart.targets[i] === null ? 'no plan target' : `plan ${chart.targets[i]} per week`,
  }))
}

/** The latest body weight and when it was entered. */
export function summarizeBodyWeight(bodyWeight: Progress['bodyWeight'], unit: Unit): SummaryRow[] {
  const latest = [...bodyWeight].sort((a, b) => toMs(a.date) - toMs(b.date)).at(-1)
  return latest ? [{ label: 'Latest', value: formatLoad(latest.weightKg, unit, 1), note: formatShortDate(latest.date) }] : []
}
