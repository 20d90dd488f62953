import { describe, expect, it } from 'vitest'
import type { Progress } from '@shared/schemas/athlete.schema'
import {
  buildBodyWeightSeries, buildE1rmSeries, buildWeeklySetsChart, loadAxisTitle, summarizeBodyWeight, summarizeE1rm,
  summarizeWeeklySets,
} from '@/components/progress/progress-chart-data'
import { seriesColor, withAlpha } from '@/components/progress/chart-colors'

const e1rm: Progress['e1rm'] = [
  {
    exerciseId: 1,
    exercise: 'Back squat',
    points: [
      { date: '2026-11-14T10:00:00.000Z', e1rmKg: 110 },
      { date: '2026-10-31T10:00:00.000Z', e1rmKg: 100 },
    ],
  },
  { exerciseId: 2, exercise: 'Bench press', points: [] },
]

describe('the estimated-1RM chart data', () => {
  it('converts kilograms to pounds for a pound viewer (1 lb = 0.45359237 kg, NIST SP 811 App. B) and sorts by date', () => {
    const [squat, ...rest] = buildE1rmSeries(e1rm, 'lb')

    expect(rest).toEqual([])
    expect(squat!.label).toBe('Back squat')
    expect(squat!.points.map((p) => p.y)).toEqual([220.5, 242.5])
    expect(squat!.points[0]!.x).toBe(Date.parse('2026-10-31T10:00:00.000Z'))
    expect(loadAxisTitle('Estimated 1RM', 'lb')).toBe('Estimated 1RM (lb)')
  })

  it('keeps kilograms for a kilogram viewer', () => {
    expect(buildE1rmSeries(e1rm, 'kg')[0]!.points.map((p) => p.y)).toEqual([100, 110])
  })

  it('summarises the latest value and the change since the first point in the viewer unit', () => {
    expect(summarizeE1rm(e1rm, 'kg')).toEqual([{ label: 'Back squat', value: '110 kg', note: '+10 kg since Oct 31 (Nov 14)' }])
    expect(summarizeE1rm(e1rm, 'lb')[0]!.value).toBe('242.5 lb')
  })
})

describe('the weekly hard-sets chart data', () => {
  const weeklySets: Progress['weeklySets'] = [
    { weekStart: '2026-11-02', muscle: 'Quads', sets: 9 },
    { weekStart: '2026-11-09', muscle: 'Quads', sets: 10 },
    { weekStart: '2026-11-09', muscle: 'Chest', sets: 12 },
    { weekStart: '2026-11-16', muscle: 'Biceps', sets: 4 },
    { weekStart: '2026-11-16', muscle: 'Quads', sets: 8 },
    { weekStart: '2026-11-23', muscle: 'Chest', sets: 14 },
    { weekStart: '2026-11-30', muscle: 'Quads', sets: 11 },
  ]
  const plan: Progress['planWeeklySets'] = [
    { muscle: 'Chest', sets: 12 },
    { muscle: 'Quads', sets: 14 },
    { muscle: 'Hamstrings', sets: 8 },
  ]

  it('puts the planned muscles first (most sets first), then the others, and lines the targets up with them', () => {
    const chart = buildWeeklySetsChart(weeklySets, plan)

    expect(chart.muscles).toEqual(['Quads', 'Chest', 'Hamstrings', 'Biceps'])
    expect(chart.targets).toEqual([14, 12, 8, null])
  })

  it('keeps the last four weeks, oldest first, with zero sets where a muscle was not trained', () => {
    const chart = buildWeeklySetsChart(weeklySets, plan)

    expect(chart.weeks.map((w) => w.weekStart)).toEqual(['2026-11-09', '2026-11-16', '2026-11-23', '2026-11-30'])
    expect(chart.weeks[0]).toEqual({ weekStart: '2026-11-09', label: 'Week of Nov 9', sets: [10, 12, 0, 0] })
    expect(chart.weeks[1]!.sets).toEqual([8, 0, 0, 4])
    expect(chart.weeks[3]!.sets).toEqual([11, 0, 0, 0])
  })

  it('summarises the latest week against the plan', () => {
    const rows = summarizeWeeklySets(buildWeeklySetsChart(weeklySets, plan))
    expect(rows[0]).toEqual({ label: 'Quads', value: '11 sets', note: 'plan 14 per week' })
    expect(rows[3]).toEqual({ label: 'Biceps', value: '0 sets', note: 'no plan target' })
  })

  it('draws the plan targets alone when nothing was logged yet', () => {
    const chart = buildWeeklySetsChart([], plan)
    expect(chart.weeks).toEqual([])
    expect(chart.targets).toEqual([14, 12, 8])
  })
})

describe('the body-weight chart data', () => {
  const bodyWeight: Progress['bodyWeight'] = [
    { date: '2026-11-20', weightKg: 80.2 },
    { date: '2026-11-13', weightKg: 81 },
  ]

  it('converts to pounds by date order and summarises the latest entry', () => {
    const series = buildBodyWeightSeries(bodyWeight, 'lb')
    expect(series.points.map((p) => p.y)).toEqual([178.6, 176.8])
    expect(series.points[0]!.x).toBe(Date.UTC(2026, 10, 13))
    expect(summarizeBodyWeight(bodyWeight, 'kg')).toEqual([{ label: 'Latest', value: '80.2 kg', note: 'Nov 20' }])
  })

  it('has nothing to summarise without entries', () => {
    expect(buildBodyWeightSeries([], 'kg').points).toEqual([])
    expect(summarizeBodyWeight([], 'kg')).toEqual([])
  })
})

describe('chart colours', () => {
  const colors = { ink: '#12343b', amber: '#f2a541', moss: '#4f7942', brick: '#c8553d', grid: '#ddd7c7', muted: '#5a676a' }

  it('cycles ink, amber, moss, brick for the series', () => {
    expect([0, 1, 2, 3, 4].map((i) => seriesColor(colors, i))).toEqual(['#12343b', '#f2a541', '#4f7942', '#c8553d', '#12343b'])
  })

  it('turns a hex colour into rgba at an opacity and leaves other forms alone', () => {
    expect(withAlpha('#12343b', 0.5)).toBe('rgba(18, 52, 59, 0.5)')
    expect(withAlpha('rgb(1, 2, 3)', 0.5)).toBe('rgb(1, 2, 3)')
  })
})
