import {
  DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes,
  type InferCreationAttributes, type NonAttribute, type Sequelize,
} from 'sequelize'
import type { TakenOption } from '@shared/schemas/run.schema'
import type { SessionStatus, SetKind, VersionLabel } from '@shared/schemas/session.schema'
import type { SlotRole } from '@shared/schemas/train.schema'
import type { ExerciseModel } from './exercise.model'

export class SessionModel extends Model<InferAttributes<SessionModel>, InferCreationAttributes<SessionModel>> {
  declare id: CreationOptional<number>
  declare athleteId: ForeignKey<number>
  declare assignmentId: ForeignKey<number> | null
  declare planDayId: ForeignKey<number> | null
  /** Copied from the plan when the session is made, so plan edits never rewrite history. */
  declare dayName: string | null
  declare versionLabel: VersionLabel | null
  declare status: SessionStatus
  declare startedAt: Date | null
  declare completedAt: Date | null
  declare summary: unknown
  declare note: string | null
  declare rotationIndex: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare sets?: NonAttribute<SetLogModel[]>

  static initModel(sequelize: Sequelize) {
    SessionModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        dayName: { type: DataTypes.STRING(60), allowNull: true },
        versionLabel: { type: DataTypes.STRING(2), allowNull: true },
        status: { type: DataTypes.STRING(12), allowNull: false },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        completedAt: { type: DataTypes.DATE, allowNull: true },
        summary: { type: DataTypes.JSON, allowNull: true },
        note: { type: DataTypes.TEXT, allowNull: true },
        rotationIndex: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'sessions', underscored: true },
    )
  }
}

export class SetLogModel extends Model<InferAttributes<SetLogModel>, InferCreationAttributes<SetLogModel>> {
  /** Made by the client (UUID) so that a retried post never makes a second row. */
  declare id: string
  declare sessionId: ForeignKey<number>
  declare exerciseId: ForeignKey<number>
  declare slotId: ForeignKey<number> | null
  declare position: number
  declare kind: SetKind
  declare targetLoadKg: number | null
  declare targetRepsMin: number | null
  declare targetRepsMax: number | null
  declare toFailure: CreationOptional<boolean>
  declare targetRir: number | null
  declare loadKg: number | null
  declare reps: number | null
  declare rir: number | null
  declare failure: CreationOptional<boolean>
  declare note: string | null
  declare loggedAt: Date | null
  declare skipped: CreationOptional<boolean>
  declare editedAt: CreationOptional<Date | null>
  declare targetReps: CreationOptional<number | null>
  declare role: CreationOptional<SlotRole | null>
  /** Planned as a deload: progress and plateau checks leave the set out. */
  declare deload: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare exercise?: NonAttribute<ExerciseModel>
  declare session?: NonAttribute<SessionModel>
  declare video?: NonAttribute<UploadModel | null>

  static initModel(sequelize: Sequelize) {
    SetLogModel.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        position: { type: DataTypes.INTEGER, allowNull: false },
        kind: { type: DataTypes.STRING(10), allowNull: false },
        targetLoadKg: { type: DataTypes.DOUBLE, allowNull: true },
        targetRepsMin: { type: DataTypes.INTEGER, allowNull: true },
        targetRepsMax: { type: DataTypes.INTEGER, allowNull: true },
        toFailure: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        targetRir: { type: DataTypes.INTEGER, allowNull: true },
        loadKg: { type: DataTypes.DOUBLE, allowNull: true },
        reps: { type: DataTypes.INTEGER, allowNull: true },
        rir: { type: DataTypes.INTEGER, allowNull: true },
        failure: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        note: { type: DataTypes.TEXT, allowNull: true },
        loggedAt: { type: DataTypes.DATE, allowNull: true },
        skipped: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        editedAt: { type: DataTypes.DATE, allowNull: true },
        targetReps: { type: DataTypes.INTEGER, allowNull: true },
        role: { type: DataTypes.STRING(20), allowNull: true },
        deload: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'set_logs', underscored: true },
    )
  }
}

export class NextStepModel extends Model<InferAttributes<NextStepModel>, InferCreationAttributes<NextStepModel>> {
  declare id: CreationOptional<number>
  declare athleteId: ForeignKey<number>
  declare exerciseId: ForeignKey<number>
  declare slotId: ForeignKey<number> | null
  declare sessionId: ForeignKey<number> | null
  declare status: 'proposed' | 'taken' | 'edited'
  declare targetLoadKg: number | null
  declare targetRepsMin: number | null
  declare targetRepsMax: number | null
  declare targetReps: CreationOptional<number | null>
  /** Which option was taken: the next step, its alternative, an edit, or a plateau option. */
  declare option: CreationOptional<TakenOption | null>
  declare reason: unknown
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    NextStepModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        status: { type: DataTypes.STRING(10), allowNull: false },
        targetLoadKg: { type: DataTypes.DOUBLE, allowNull: true },
        targetRepsMin: { type: DataTypes.INTEGER, allowNull: true },
        targetRepsMax: { type: DataTypes.INTEGER, allowNull: true },
        targetReps: { type: DataTypes.INTEGER, allowNull: true },
        option: { type: DataTypes.STRING(16), allowNull: true },
        reason: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'next_steps', underscored: true },
    )
  }
}

export class ReviewModel extends Model<InferAttributes<ReviewModel>, InferCreationAttributes<ReviewModel>> {
  declare id: CreationOptional<number>
  declare sessionId: ForeignKey<number>
  declare coachId: ForeignKey<number>
  declare reviewedAt: Date
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    ReviewModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        reviewedAt: { type: DataTypes.DATE, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'reviews', underscored: true },
    )
  }
}

export class CommentModel extends Model<InferAttributes<CommentModel>, InferCreationAttributes<CommentModel>> {
  declare id: CreationOptional<number>
  declare sessionId: ForeignKey<number>
  declare setLogId: ForeignKey<string> | null
  declare authorId: ForeignKey<number>
  declare body: string
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    CommentModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        body: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'comments', underscored: true },
    )
  }
}

export class UploadModel extends Model<InferAttributes<UploadModel>, InferCreationAttributes<UploadModel>> {
  declare id: CreationOptional<number>
  declare setLogId: ForeignKey<string>
  declare ownerId: ForeignKey<number>
  declare storageKey: string
  declare mimeType: string
  declare sizeBytes: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    UploadModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        storageKey: { type: DataTypes.STRING(80), allowNull: false },
        mimeType: { type: DataTypes.STRING(60), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'uploads', underscored: true },
    )
  }
}
