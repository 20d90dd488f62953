import {
  DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize,
} from 'sequelize'

/**
 * An estimated 1RM (kg, load moved) to plan a lift's first session from, when the lifter has no
 * history on it: entered by their coach, or worked out from a recent set the lifter entered.
 */
export class StartEstimateModel extends Model<InferAttributes<StartEstimateModel>, InferCreationAttributes<StartEstimateModel>> {
  declare id: CreationOptional<number>
  declare athleteId: ForeignKey<number>
  declare exerciseId: ForeignKey<number>
  declare e1rmKg: number
  /** The recent set it came from (logged load and reps), when there was one. */
  declare loadKg: number | null
  declare reps: number | null
  declare source: 'coach' | 'recent_set' | 'ramp'
  declare setBy: ForeignKey<number> | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    StartEstimateModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        e1rmKg: { type: DataTypes.DOUBLE, allowNull: false },
        loadKg: { type: DataTypes.DOUBLE, allowNull: true },
        reps: { type: DataTypes.INTEGER, allowNull: true },
        source: { type: DataTypes.STRING(12), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'start_estimates', underscored: true },
    )
  }
}
