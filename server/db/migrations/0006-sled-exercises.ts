import type { QueryInterface } from 'sequelize'

/**
 * The shared library's plate-loaded machines are loaded on a sled (its own mass plus plates a
 * side), no longer from a pin stack: databases seeded before the gym editor get the library's
 * new equipment kind. A coach's own exercises keep what the coach chose.
 */
const SLED_EXERCISES = ['Leg press', 'Hack squat machine']

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.bulkUpdate('exercises', { equipment_kind: 'sled' }, { owner_id: null, name: SLED_EXERCISES, equipment_kind: 'machine' })
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.bulkUpdate('exercises', { equipment_kind: 'machine' }, { owner_id: null, name: SLED_EXERCISES, equipment_kind: 'sled' })
}
