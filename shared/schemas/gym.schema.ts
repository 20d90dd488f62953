import { z } from './zod'
import { barbellSchema, bodyweightSchema, dumbbellSchema, stackSchema } from '../domain/equipment'
import { gymProfileSchema } from '../domain/gym'
import type { Unit } from './common.schema'

/**
 * A lifter's gym as the lifter or their coach edits it (GET and PUT /api/me/gym and
 * /api/athletes/:id/gym). The body is the stored gym profile without what the server derives:
 * the engine's `collarMass` comes from `collars`, and names are dropped. Every mass is in the
 * unit of its own piece of equipment.
 */

/** Bounds a real gym stays within, per unit: they keep typing slips out and the engine quick. */
export const GYM_LIMITS: Record<Unit, {
  bar: readonly [number, number]
  collar: number
  plate: readonly [number, number]
  /** All the plates of one side of a bar or sled together. */
  perSide: number
  dumbbell: readonly [number, number]
  stackStep: number
  addOn: readonly [number, number]
  sled: number
}> = {
  kg: { bar: [1, 50], collar: 5, plate: [0.1, 50], perSide: 500, dumbbell: [0.5, 100], stackStep: 500, addOn: [0.1, 25], sled: 250 },
  lb: { bar: [2, 110], collar: 11, plate: [0.25, 110], perSide: 1100, dumbbell: [1, 220], stackStep: 1100, addOn: [0.25, 55], sled: 550 },
}

/** Masses come in steps of 0.05 (kg or lb): enough for any microloading plate, few sums to try. */
export const MASS_GRID = 0.05
const onGrid = (mass: number) => Math.abs(mass / MASS_GRID - Math.round(mass / MASS_GRID)) < 1e-6

export const MAX_PLATE_PAIRS = 20
export const MAX_PLATE_SIZES = 12

const mass = (message: string) => z.number(message)
const stockSchema = (most: number, what: string) =>
  z.object({
    mass: mass(`Enter each ${what}'s mass in numbers`),
    count: z.int('Enter a whole number').check(
      z.gte(1, `At least 1; remove the ${what} if there is none`),
      z.lte(most, `At most ${most}`),
    ),
  })

const platesSchema = z.array(stockSchema(MAX_PLATE_PAIRS, 'plate')).check(
  z.minLength(1, 'Add at least one plate size'),
  z.maxLength(MAX_PLATE_SIZES, `At most ${MAX_PLATE_SIZES} plate sizes`),
)

export const gymBarbellInputSchema = z.extend(z.omit(barbellSchema, { name: true, collarMass: true }), {
  barMass: mass("Enter the bar's mass in numbers"),
  collars: z.object({ counted: z.boolean('Say whether collars are counted'), mass: mass('Enter the mass of one collar in numbers') }),
  plates: platesSchema,
})
export const gymSledInputSchema = z.extend(z.omit(barbellSchema, { name: true, collarMass: true }), {
  barMass: mass("Enter the sled's own mass in numbers"),
  plates: platesSchema,
})
export const gymDumbbellInputSchema = z.extend(z.omit(dumbbellSchema, { name: true }), {
  pairs: z.array(mass("Enter each dumbbell's mass in numbers")).check(z.minLength(1, 'Add at least one dumbbell'), z.maxLength(100, 'At most 100 dumbbells')),
})
export const gymStackInputSchema = z.extend(z.omit(stackSchema, { name: true }), {
  steps: z.array(mass('Enter each pin setting in numbers')).check(z.minLength(1, 'Add at least one pin setting'), z.maxLength(200, 'At most 200 pin settings')),
  addOns: z.array(stockSchema(4, 'add-on weight')).check(z.maxLength(4, 'At most 4 add-on weights')),
})
export const gymBodyweightInputSchema = z.extend(z.omit(bodyweightSchema, { name: true }), {
  added: z.array(stockSchema(4, 'belt plate')).check(z.maxLength(10, 'At most 10 belt plates')),
})

type Issue = { path: (string | number)[]; message: string }

/** One list of masses: each within bounds and on the grid, none twice. */
function checkMasses(masses: number[], unit: Unit, [min, max]: readonly [number, number], what: string, path: (i: number) => (string | number)[]): Issue[] {
  const issues: Issue[] = []
  const seen = new Set<number>()
  masses.forEach((m, i) => {
    const key = Math.round(m / MASS_GRID)
    if (m < min || m > max) issues.push({ path: path(i), message: `${what} weigh ${min} to ${max} ${unit}` })
    else if (!onGrid(m)) issues.push({ path: path(i), message: `Use steps of ${MASS_GRID} ${unit} (for example 1.25)` })
    else if (seen.has(key)) issues.push({ path: path(i), message: `${m} ${unit} is listed twice` })
    seen.add(key)
  })
  return issues
}

function checkPlates(plates: Array<{ mass: number; count: number }>, unit: Unit, at: string): Issue[] {
  const limits = GYM_LIMITS[unit]
  const issues = checkMasses(plates.map((p) => p.mass), unit, limits.plate, 'Plates', (i) => [at, 'plates', i, 'mass'])
  const perSide = plates.reduce((sum, p) => sum + p.mass * p.count, 0)
  if (perSide > limits.perSide) {
    issues.push({ path: [at, 'plates'], message: `More than ${limits.perSide} ${unit} of plates a side: keep the plates you really use` })
  }
  return issues
}

function checkBetween(value: number, [min, max]: readonly [number, number], path: (string | number)[], message: string): Issue[] {
  return value < min || value > max ? [{ path, message }] : []
}

/** The bounds that depend on each piece's unit, in words with that unit. */
function gymIssues(gym: z.infer<typeof gymShapeSchema>): Issue[] {
  const { barbell, sled, dumbbell, stack, bodyweight } = gym
  const bar = GYM_LIMITS[barbell.unit]
  const sledLimits = GYM_LIMITS[sled.unit]
  const collarText = `One collar weighs more than 0 and at most ${bar.collar} ${barbell.unit}`
  return [
    ...checkBetween(barbell.barMass, bar.bar, ['barbell', 'barMass'], `A bar weighs ${bar.bar[0]} to ${bar.bar[1]} ${barbell.unit}`),
    ...checkBetween(barbell.collars.mass, [barbell.collars.counted ? MASS_GRID : 0, bar.collar], ['barbell', 'collars', 'mass'], collarText),
    ...checkPlates(barbell.plates, barbell.unit, 'barbell'),
    ...checkBetween(sled.barMass, [0, sledLimits.sled], ['sled', 'barMass'], `A sled weighs 0 to ${sledLimits.sled} ${sled.unit}`),
    ...checkPlates(sled.plates, sled.unit, 'sled'),
    ...checkMasses(dumbbell.pairs, dumbbell.unit, GYM_LIMITS[dumbbell.unit].dumbbell, 'Dumbbells', (i) => ['dumbbell', 'pairs', i]),
    ...checkMasses(stack.steps, stack.unit, [0, GYM_LIMITS[stack.unit].stackStep], 'Pin settings', (i) => ['stack', 'steps', i]),
    ...checkMasses(stack.addOns.map((a) => a.mass), stack.unit, GYM_LIMITS[stack.unit].addOn, 'Add-on weights', (i) => ['stack', 'addOns', i, 'mass']),
    ...checkMasses(bodyweight.added.map((a) => a.mass), bodyweight.unit, GYM_LIMITS[bodyweight.unit].plate, 'Belt plates', (i) => ['bodyweight', 'added', i, 'mass']),
  ]
}

const gymShapeSchema = z.object({
  barbell: gymBarbellInputSchema,
  dumbbell: gymDumbbellInputSchema,
  stack: gymStackInputSchema,
  bodyweight: gymBodyweightInputSchema,
  sled: gymSledInputSchema,
})

/** PUT body: the whole gym. */
export const gymInputSchema = gymShapeSchema.check(
  z.superRefine((gym, ctx) => {
    for (const issue of gymIssues(gym)) ctx.addIssue({ code: 'custom', input: gym, ...issue })
  }),
)
export type GymInput = z.infer<typeof gymInputSchema>

/** GET and PUT answer: the complete profile, and when it was saved (null: the unit's preset). */
export const gymAnswerSchema = z.object({ gym: gymProfileSchema, savedAt: z.nullable(z.string()) })
export type GymAnswer = z.infer<typeof gymAnswerSchema>
