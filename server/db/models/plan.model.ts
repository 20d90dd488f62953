import {
  DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes,
  type InferCreationAttributes, type NonAttribute, type Sequelize,
} from 'sequelize'
import type { SlotRole } from '@shared/schemas/train.schema'
import type { VersionLabel } from '@shared/schemas/session.schema'
import type { ExerciseModel } from './exercise.model'

export class PlanModel extends Model<InferAttributes<PlanModel>, InferCreationAttributes<PlanModel>> {
  declare id: CreationOptional<number>
  declare ownerId: ForeignKey<number>
  declare name: string
  declare splitKind: string
  declare archivedAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare days?: NonAttribute<PlanDayModel[]>

  static initModel(sequelize: Sequelize) {
    PlanModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.STRING(80), allowNull: false },
        splitKind: { type: DataTypes.STRING(30), allowNull: false },
        archivedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'plans', underscored: true },
    )
  }
}

export class PlanDayModel extends Model<InferAttributes<PlanDayModel>, InferCreationAttributes<PlanDayModel>> {
  declare id: CreationOptional<number>
  declare planId: ForeignKey<number>
  declare position: number
  declare name: string
  declare isRest: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare versions?: NonAttribute<DayVersionModel[]>

  static initModel(sequelize: Sequelize) {
    PlanDayModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        position: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(60), allowNull: false },
        isRest: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'plan_days', underscored: true },
    )
  }
}

export class DayVersionModel extends Model<
  InferAttributes<DayVersionModel>,
  InferCreationAttributes<DayVersionModel>
> {
  declare id: CreationOptional<number>
  declare planDayId: ForeignKey<number>
  declare label: VersionLabel
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare slots?: NonAttribute<SlotModel[]>

  static initModel(sequelize: Sequelize) {
    DayVersionModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        label: { type: DataTypes.STRING(2), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'day_versions', underscored: true },
    )
  }
}

export class SlotModel extends Model<InferAttributes<SlotModel>, InferCreationAttributes<SlotModel>> {
  declare id: CreationOptional<number>
  declare dayVersionId: ForeignKey<number>
  declare exerciseId: ForeignKey<number>
  declare position: number
  declare role: SlotRole
  /** A set scheme validated by the engine's set-scheme schema. */
  declare scheme: unknown
  declare restSec: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare exercise?: NonAttribute<ExerciseModel>

  static initModel(sequelize: Sequelize) {
    SlotModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        position: { type: DataTypes.INTEGER, allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false },
        scheme: { type: DataTypes.JSON, allowNull: false },
        restSec: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'slots', underscored: true },
    )
  }
}

export class AssignmentModel extends Model<
  InferAttributes<AssignmentModel>,
  InferCreationAttributes<AssignmentModel>
> {
  declare id: CreationOptional<number>
  declare athleteId: ForeignKey<number>
  declare planId: ForeignKey<number>
  declare startDate: string
  declare rotationIndex: CreationOptional<number>
  declare active: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare plan?: NonAttribute<PlanModel>

  static initModel(sequelize: Sequelize) {
    AssignmentModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        startDate: { type: DataTypes.DATEONLY, allowNull: false },
        rotationIndex: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'assignments', underscored: true },
    )
  }
}
