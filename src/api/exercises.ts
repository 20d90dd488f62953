import { z } from '@shared/schemas/zod'
import {
  exerciseSchema,
  type CreateExerciseInput,
  type Exercise,
  type ListExercisesQuery,
  type MovementPattern,
} from '@shared/schemas/exercise.schema'
import { request } from './client'

const exerciseListSchema = z.object({ exercises: z.array(exerciseSchema) })

/** The exercise library, optionally one movement pattern only (the swap list). */
export async function listExercises(params: { pattern?: MovementPattern } = {}): Promise<Exercise[]> {
  return (await request('GET', '/exercises', { query: { pattern: params.pattern }, schema: exerciseListSchema })).exercises
}

const exerciseBodySchema = z.object({ exercise: exerciseSchema })

/** The library searched by name and filtered by movement pattern, muscle and equipment (the plan builder's picker). */
export async function searchExercises(query: ListExercisesQuery = {}): Promise<Exercise[]> {
  return (await request('GET', '/exercises', { query: { ...query, q: query.q || undefined }, schema: exerciseListSchema })).exercises
}

/** A coach's own exercise, added to their library. */
export async function createExercise(input: CreateExerciseInput): Promise<Exercise> {
  return (await request('POST', '/exercises', { body: input, schema: exerciseBodySchema })).exercise
}
