import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import { sequelize } from '@server/db/sequelize'

/** (tier, product, min cases) → price per bar; the buyer pays the break of the line's case count. */
export class PriceBreak extends Model<InferAttributes<PriceBreak>, InferCreationAttributes<PriceBreak>> {
  declare id: CreationOptional<number>
  declare tierId: number
  declare productId: number
  declare minCases: number
  declare unitPriceCents: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

PriceBreak.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    tierId: { type: DataTypes.INTEGER, allowNull: false },
    productId: { type: DataTypes.INTEGER, allowNull: false },
    minCases: { type: DataTypes.INTEGER, allowNull: false },
    unitPriceCents: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'price_breaks' },
)
