import { describe, expect, it } from 'vitest'
import { sessionCapWarnings } from '@shared/domain/plan-checks'
import type { NextStepOptionView } from '@shared/schemas/run.schema'
import { capWarningText, loadText, loadTimesReps, nextStepTitle } from '@/utils/set-text'

describe('set words', () => {
  it('words the caps an added set passes from the engine\'s own warnings', () => {
    // Caps: 3 hard sets of one compound exercise and 4 of one movement pattern in a session
    // (common practice, no published source; shared/domain/plan-checks.ts).
    const warnings = sessionCapWarnings([
      { role: 'compound_primary', exerciseName: 'Back squat', pattern: 'squat', workingSets: 2 },
      { role: 'accessory', exerciseName: 'Back squat', pattern: 'squat', workingSets: 2 },
      { role: 'accessory', exerciseName: 'Leg press', pattern: 'squat', workingSets: 1 },
    ])

    expect(warnings.map(capWarningText)).toEqual([
      'Back squat: 4 hard sets in this session, the usual cap for a compound exercise is 3.',
      'Squat pattern: 5 hard sets in this session, the usual cap is 4.',
    ])
    expect(capWarningText({ code: 'PRIMARY_COMPOUND_OVER_CAP', message: '', values: { exercise: 'Bench press', sets: 4, cap: 3 } })).toBe(
      'Bench press: 4 working sets, the usual cap for a main lift is 3.',
    )
  })

  it('reads loads by how the lift is loaded: as is, body plus the added load, or the help', () => {
    expect(loadText(100, 'kg')).toBe('100 kg')
    expect(loadText(10, 'kg', 'bodyweight')).toBe('Body + 10 kg')
    expect(loadText(0, 'kg', 'bodyweight')).toBe('Body weight')
    expect(loadText(30, 'kg', 'assisted')).toBe('Help 30 kg')
    // 1 lb = 0.45359237 kg exactly (International Yard and Pound Agreement, 1959): 11.33980925 kg = 25 lb.
    expect(loadTimesReps(11.33980925, 8, 'lb', 'bodyweight')).toBe('Body + 25 lb × 8')
  })

  it('titles a load cut "Lighter load"', () => {
    const option = { action: 'cut_load', targetLoadKg: 95, targetReps: 8 } as NextStepOptionView
    expect(nextStepTitle(option, 'kg')).toBe('Lighter load: 95 kg × 8')
  })
})
