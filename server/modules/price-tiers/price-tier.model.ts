import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import { sequelize } from '@server/db/sequelize'

export class PriceTier extends Model<InferAttributes<PriceTier>, InferCreationAttributes<PriceTier>> {
  declare id: CreationOptional<number>
  declare name: string
  /** numeric(5,2): pg returns it as a string; the getter hands out a number. */
  declare targetMarginPct: number
  declare sortOrder: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

PriceTier.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.TEXT, allowNull: false },
    targetMarginPct: {
      type: DataTypes.DECIMAL(5, 2),
      allowNull: false,
      get() {
        return Number(this.getDataValue('targetMarginPct'))
      },
    },
    sortOrder: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'price_tiers' },
)
