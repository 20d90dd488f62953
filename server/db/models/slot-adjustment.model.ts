import {
  DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize,
} from 'sequelize'

/**
 * One lifter's own change to a slot of the plan they follow: a fresh exercise after rotating
 * the day's version, or working sets added on a plateau. The coach's plan, which other athletes
 * may share, stays as written.
 */
export class SlotAdjustmentModel extends Model<InferAttributes<SlotAdjustmentModel>, InferCreationAttributes<SlotAdjustmentModel>> {
  declare id: CreationOptional<number>
  declare athleteId: ForeignKey<number>
  declare slotId: ForeignKey<number>
  /** The exercise trained in this slot instead of the plan's; null: the plan's. */
  declare exerciseId: ForeignKey<number> | null
  /** Working sets on top of the slot's scheme (kept within the caps when planned). */
  declare extraSets: CreationOptional<number>
  /** Who made the change: the lifter or their coach. */
  declare changedBy: ForeignKey<number> | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    SlotAdjustmentModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        extraSets: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'slot_adjustments', underscored: true },
    )
  }
}
