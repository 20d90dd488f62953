import {
  DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes,
  type InferCreationAttributes, type Sequelize,
} from 'sequelize'
import type { NotifyCompleted } from '@shared/schemas/auth.schema'
import type { Role, Unit } from '@shared/schemas/common.schema'

export class UserModel extends Model<InferAttributes<UserModel>, InferCreationAttributes<UserModel>> {
  declare id: CreationOptional<number>
  declare clubId: ForeignKey<number> | null
  declare name: string
  declare email: string
  declare passwordHash: string
  declare role: Role
  declare unit: Unit
  declare active: CreationOptional<boolean>
  declare tokenVersion: CreationOptional<number>
  declare cautionsAcknowledgedAt: Date | null
  /** Coaches: e-mail on each completed session, a daily digest, or none. */
  declare notifyCompleted: CreationOptional<NotifyCompleted>
  declare lastDigestAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    UserModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.STRING(80), allowNull: false },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        role: { type: DataTypes.STRING(10), allowNull: false },
        unit: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'kg' },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        tokenVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        cautionsAcknowledgedAt: { type: DataTypes.DATE, allowNull: true },
        notifyCompleted: { type: DataTypes.STRING(5), allowNull: false, defaultValue: 'each' },
        lastDigestAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users', underscored: true },
    )
  }
}

export class ClubModel extends Model<InferAttributes<ClubModel>, InferCreationAttributes<ClubModel>> {
  declare id: CreationOptional<number>
  declare name: string
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    ClubModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'clubs', underscored: true },
    )
  }
}

export class CoachAthleteModel extends Model<
  InferAttributes<CoachAthleteModel>,
  InferCreationAttributes<CoachAthleteModel>
> {
  declare id: CreationOptional<number>
  declare coachId: ForeignKey<number>
  declare athleteId: ForeignKey<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    CoachAthleteModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'coach_athletes', underscored: true },
    )
  }
}

export class InviteModel extends Model<InferAttributes<InviteModel>, InferCreationAttributes<InviteModel>> {
  declare id: CreationOptional<number>
  declare coachId: ForeignKey<number>
  declare email: string
  declare name: string
  declare tokenHash: string
  declare expiresAt: Date
  declare acceptedAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    InviteModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        email: { type: DataTypes.STRING(254), allowNull: false },
        name: { type: DataTypes.STRING(80), allowNull: false },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'invites', underscored: true },
    )
  }
}

export class BodyWeightModel extends Model<
  InferAttributes<BodyWeightModel>,
  InferCreationAttributes<BodyWeightModel>
> {
  declare id: CreationOptional<number>
  declare userId: ForeignKey<number>
  declare measuredOn: string
  declare weightKg: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    BodyWeightModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        measuredOn: { type: DataTypes.DATEONLY, allowNull: false },
        weightKg: { type: DataTypes.DOUBLE, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'body_weights', underscored: true },
    )
  }
}

export class PasswordResetModel extends Model<
  InferAttributes<PasswordResetModel>,
  InferCreationAttributes<PasswordResetModel>
> {
  declare id: CreationOptional<number>
  declare userId: ForeignKey<number>
  declare tokenHash: string
  declare expiresAt: Date
  declare usedAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    PasswordResetModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'password_resets', underscored: true },
    )
  }
}
