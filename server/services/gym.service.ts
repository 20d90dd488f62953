import { defaultGym, gymProfileSchema } from '@shared/domain/gym'
import type { GymAnswer, GymInput } from '@shared/schemas/gym.schema'
import { EquipmentProfileModel, UserModel } from '../db'
import { AppError } from '../errors'
import { assertCoachOf } from './access.service'

/**
 * A lifter's gym: the equipment profile the engine loads every exercise with (read by
 * `gymOf` in session-planning.service.ts). The lifter edits their own; their coach edits it
 * for them. Without a stored profile the lifter trains with their unit's preset.
 */

const PROFILE_NAME = 'My gym'

function defaultProfileOf(userId: number) {
  return EquipmentProfileModel.findOne({ where: { userId, isDefault: true } })
}

async function answerFor(lifter: UserModel): Promise<GymAnswer> {
  const row = await defaultProfileOf(lifter.id)
  const parsed = row ? gymProfileSchema.safeParse(row.spec) : null
  if (row && parsed?.success) return { gym: parsed.data, savedAt: row.updatedAt.toISOString() }
  return { gym: defaultGym(lifter.unit), savedAt: null }
}

async function save(lifter: UserModel, input: GymInput): Promise<GymAnswer> {
  // The input schema checked every bound; parsing completes it (collarMass from the collars).
  const gym = gymProfileSchema.parse(input)
  const sequelize = EquipmentProfileModel.sequelize!
  // One transaction (queued, IMMEDIATE): two saves at once cannot both create a default row.
  await sequelize.transaction(async (transaction) => {
    const row = await EquipmentProfileModel.findOne({ where: { userId: lifter.id, isDefault: true }, transaction })
    if (row) await row.update({ spec: gym }, { transaction })
    else await EquipmentProfileModel.create({ userId: lifter.id, name: PROFILE_NAME, spec: gym, isDefault: true }, { transaction })
  })
  return answerFor(lifter)
}

async function coachedAthlete(coach: UserModel, athleteId: number): Promise<UserModel> {
  await assertCoachOf(coach, athleteId)
  const athlete = await UserModel.findByPk(athleteId)
  if (!athlete) throw AppError.notFound('Athlete')
  return athlete
}

export function getOwnGym(lifter: UserModel): Promise<GymAnswer> {
  return answerFor(lifter)
}

export function saveOwnGym(lifter: UserModel, input: GymInput): Promise<GymAnswer> {
  return save(lifter, input)
}

export async function getAthleteGym(coach: UserModel, athleteId: number): Promise<GymAnswer> {
  return answerFor(await coachedAthlete(coach, athleteId))
}

export async function saveAthleteGym(coach: UserModel, athleteId: number, input: GymInput): Promise<GymAnswer> {
  return save(await coachedAthlete(coach, athleteId), input)
}
