import { mkdirSync } from 'node:fs'
import { dirname } from 'node:path'
import { Sequelize, type Transaction } from 'sequelize'
import { makeConcurrencySafe } from './sqlite-concurrency'
import { cacheTableInfo } from './sqlite-table-info-cache'
import { prepared, rowToModel } from './statement-pool'
import { ClubModel, CoachAthleteModel, InviteModel, UserModel, BodyWeightModel, PasswordResetModel } from './models/user.model'
import { EquipmentProfileModel, ExerciseModel } from './models/exercise.model'
import { AssignmentModel, DayVersionModel, PlanDayModel, PlanModel, SlotModel } from './models/plan.model'
import {
  CommentModel, NextStepModel, ReviewModel, SessionModel, SetLogModel, UploadModel,
} from './models/session.model'
import { SlotAdjustmentModel } from './models/slot-adjustment.model'
import { StartEstimateModel } from './models/start-estimate.model'

export * from './models/user.model'
export * from './models/exercise.model'
export * from './models/plan.model'
export * from './models/session.model'
export * from './models/slot-adjustment.model'
export * from './models/start-estimate.model'

/** Every association, in one place. */
function associate() {
  UserModel.belongsTo(ClubModel, { as: 'club', foreignKey: 'clubId' })
  CoachAthleteModel.belongsTo(UserModel, { as: 'coach', foreignKey: 'coachId' })
  CoachAthleteModel.belongsTo(UserModel, { as: 'athlete', foreignKey: 'athleteId' })
  InviteModel.belongsTo(UserModel, { as: 'coach', foreignKey: 'coachId' })
  BodyWeightModel.belongsTo(UserModel, { as: 'user', foreignKey: 'userId' })
  PasswordResetModel.belongsTo(UserModel, { as: 'user', foreignKey: 'userId' })

  ExerciseModel.belongsTo(UserModel, { as: 'owner', foreignKey: 'ownerId' })
  EquipmentProfileModel.belongsTo(UserModel, { as: 'user', foreignKey: 'userId' })

  PlanModel.belongsTo(UserModel, { as: 'owner', foreignKey: 'ownerId' })
  PlanModel.hasMany(PlanDayModel, { as: 'days', foreignKey: 'planId' })
  PlanDayModel.belongsTo(PlanModel, { as: 'plan', foreignKey: 'planId' })
  PlanDayModel.hasMany(DayVersionModel, { as: 'versions', foreignKey: 'planDayId' })
  DayVersionModel.belongsTo(PlanDayModel, { as: 'day', foreignKey: 'planDayId' })
  DayVersionModel.hasMany(SlotModel, { as: 'slots', foreignKey: 'dayVersionId' })
  SlotModel.belongsTo(DayVersionModel, { as: 'version', foreignKey: 'dayVersionId' })
  SlotModel.belongsTo(ExerciseModel, { as: 'exercise', foreignKey: 'exerciseId' })
  AssignmentModel.belongsTo(UserModel, { as: 'athlete', foreignKey: 'athleteId' })
  AssignmentModel.belongsTo(PlanModel, { as: 'plan', foreignKey: 'planId' })

  SessionModel.belongsTo(UserModel, { as: 'athlete', foreignKey: 'athleteId' })
  SessionModel.belongsTo(AssignmentModel, { as: 'assignment', foreignKey: 'assignmentId' })
  SessionModel.belongsTo(PlanDayModel, { as: 'planDay', foreignKey: 'planDayId' })
  SessionModel.hasMany(SetLogModel, { as: 'sets', foreignKey: 'sessionId' })
  SetLogModel.belongsTo(SessionModel, { as: 'session', foreignKey: 'sessionId' })
  SetLogModel.belongsTo(ExerciseModel, { as: 'exercise', foreignKey: 'exerciseId' })
  SetLogModel.belongsTo(SlotModel, { as: 'slot', foreignKey: 'slotId' })
  NextStepModel.belongsTo(UserModel, { as: 'athlete', foreignKey: 'athleteId' })
  NextStepModel.belongsTo(ExerciseModel, { as: 'exercise', foreignKey: 'exerciseId' })
  NextStepModel.belongsTo(SlotModel, { as: 'slot', foreignKey: 'slotId' })
  NextStepModel.belongsTo(SessionModel, { as: 'session', foreignKey: 'sessionId' })
  ReviewModel.belongsTo(SessionModel, { as: 'session', foreignKey: 'sessionId' })
  ReviewModel.belongsTo(UserModel, { as: 'coach', foreignKey: 'coachId' })
  CommentModel.belongsTo(SessionModel, { as: 'session', foreignKey: 'sessionId' })
  CommentModel.belongsTo(SetLogModel, { as: 'setLog', foreignKey: 'setLogId' })
  CommentModel.belongsTo(UserModel, { as: 'author', foreignKey: 'authorId' })
  UploadModel.belongsTo(SetLogModel, { as: 'setLog', foreignKey: 'setLogId' })
  SetLogModel.hasOne(UploadModel, { as: 'video', foreignKey: 'setLogId' })
  UploadModel.belongsTo(UserModel, { as: 'owner', foreignKey: 'ownerId' })
  SlotAdjustmentModel.belongsTo(UserModel, { as: 'athlete', foreignKey: 'athleteId' })
  SlotAdjustmentModel.belongsTo(SlotModel, { as: 'slot', foreignKey: 'slotId' })
  SlotAdjustmentModel.belongsTo(ExerciseModel, { as: 'exercise', foreignKey: 'exerciseId' })
  SlotAdjustmentModel.belongsTo(UserModel, { as: 'changer', foreignKey: 'changedBy' })
  StartEstimateModel.belongsTo(UserModel, { as: 'athlete', foreignKey: 'athleteId' })
  StartEstimateModel.belongsTo(ExerciseModel, { as: 'exercise', foreignKey: 'exerciseId' })
  StartEstimateModel.belongsTo(UserModel, { as: 'setter', foreignKey: 'setBy' })
}

const models = [
  ClubModel, UserModel, CoachAthleteModel, InviteModel, BodyWeightModel, PasswordResetModel, ExerciseModel,
  EquipmentProfileModel, PlanModel, PlanDayModel, DayVersionModel, SlotModel, AssignmentModel,
  SessionModel, SetLogModel, NextStepModel, ReviewModel, CommentModel, UploadModel, SlotAdjustmentModel, StartEstimateModel,
]

/**
 * Opens the SQLite database (WAL journal, foreign keys on) and binds the models to it.
 * The models are module-level classes, so one process holds one database at a time.
 */
export async function openDatabase(storage: string, options: { logging?: (sql: string) => void } = {}) {
  if (storage !== ':memory:') mkdirSync(dirname(storage), { recursive: true })
  const sequelize = new Sequelize({
    dialect: 'sqlite',
    storage,
    logging: options.logging ?? false,
    define: { underscored: true },
    // One connection: SQLite serialises writes anyway, and PRAGMAs are per connection.
    pool: { max: 1, min: 1, idle: 60_000 },
  })
  // SQLite-only settings belong here, in the database setup, and nowhere else.
  makeConcurrencySafe(sequelize)
  cacheTableInfo(sequelize)
  await sequelize.query('PRAGMA journal_mode = WAL')
  // With WAL, NORMAL syncs at checkpoints rather than at every commit: a crash of the app or the
  // database can never corrupt it, and only a power cut can lose the last commits (SQLite's
  // documentation, "PRAGMA synchronous"). Every commit waiting for the disk capped set logging
  // at about a thousand a second; the phone keeps each set until the server has acknowledged it.
  await sequelize.query('PRAGMA synchronous = NORMAL')
  await sequelize.query('PRAGMA foreign_keys = ON')
  await sequelize.query('PRAGMA busy_timeout = 5000')
  for (const model of models) model.initModel(sequelize)
  associate()
  return sequelize
}

/**
 * A larger page cache (MiB; SQLite's default is 2) for one transaction, whose statements run on
 * a connection of its own: bulk loads keep the indexes they write in memory.
 */
export async function enlargePageCache(sequelize: Sequelize, transaction: Transaction, mebibytes: number) {
  await sequelize.query(`PRAGMA cache_size = ${-Math.round(mebibytes * 1024)}`, { transaction })
}

/**
 * The user a sign-in token names, read with a prepared statement: the one read every
 * authenticated request makes (see statement-pool.ts).
 */
export async function findUserForToken(id: number): Promise<UserModel | null> {
  const rows = await prepared(UserModel.sequelize!, 'SELECT * FROM users WHERE id = $id').all({ id })
  return rows[0] ? rowToModel(UserModel, rows[0]) : null
}
