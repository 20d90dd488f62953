import {
  DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes,
  type InferCreationAttributes, type Sequelize,
} from 'sequelize'

export class ExerciseModel extends Model<InferAttributes<ExerciseModel>, InferCreationAttributes<ExerciseModel>> {
  declare id: CreationOptional<number>
  /** null: part of the shared library; otherwise a coach's own exercise. */
  declare ownerId: ForeignKey<number> | null
  declare name: string
  declare pattern: string
  declare primaryMuscles: string[]
  declare secondaryMuscles: string[]
  declare equipmentKind: string
  /** How the logged load relates to the load moved: 'external', 'bodyweight' or 'assisted'. */
  declare loadMode: CreationOptional<string>
  /** The exercise's own smallest load step in kg; 0: the smallest step the lifter's equipment makes. */
  declare loadStepKg: CreationOptional<number>
  declare defaultRestSec: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    ExerciseModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.STRING(80), allowNull: false },
        pattern: { type: DataTypes.STRING(30), allowNull: false },
        primaryMuscles: { type: DataTypes.JSON, allowNull: false },
        secondaryMuscles: { type: DataTypes.JSON, allowNull: false },
        equipmentKind: { type: DataTypes.STRING(20), allowNull: false },
        loadMode: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'external' },
        loadStepKg: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        defaultRestSec: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'exercises', underscored: true },
    )
  }
}

export class EquipmentProfileModel extends Model<
  InferAttributes<EquipmentProfileModel>,
  InferCreationAttributes<EquipmentProfileModel>
> {
  declare id: CreationOptional<number>
  declare userId: ForeignKey<number>
  declare name: string
  /** An equipment description validated by the engine's equipment schema. */
  declare spec: unknown
  declare isDefault: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    EquipmentProfileModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.STRING(80), allowNull: false },
        spec: { type: DataTypes.JSON, allowNull: false },
        isDefault: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'equipment_profiles', underscored: true },
    )
  }
}
