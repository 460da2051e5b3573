import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import { sequelize } from '@server/db/sequelize'

/**
 * A poured batch. Rows are written by batches.service (one transaction with its lots and its
 * `made` move); after that only location and notes change. Read paths use raw SQL joins.
 */
export class Batch extends Model<InferAttributes<Batch>, InferCreationAttributes<Batch>> {
  declare id: CreationOptional<number>
  declare productId: number
  declare recipeId: number
  declare recipeSnapshot: unknown
  declare lotCode: string
  declare pourDate: string
  declare cureDays: number
  declare readyDate: string
  /** numeric(10,2): pg returns it as a string; the getter hands out a number. */
  declare oilWeightG: number
  declare barsCut: number
  declare barsKeptBack: number
  declare keptBackReason: string | null
  declare ingredientCostCents: number
  declare costPerBarCents: number | null
  declare location: string | null
  declare notes: string | null
  declare createdBy: number | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Batch.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    productId: { type: DataTypes.INTEGER, allowNull: false },
    recipeId: { type: DataTypes.INTEGER, allowNull: false },
    recipeSnapshot: { type: DataTypes.JSONB, allowNull: false },
    lotCode: { type: DataTypes.TEXT, allowNull: false },
    pourDate: { type: DataTypes.DATEONLY, allowNull: false },
    cureDays: { type: DataTypes.INTEGER, allowNull: false },
    readyDate: { type: DataTypes.DATEONLY, allowNull: false },
    oilWeightG: {
      type: DataTypes.DECIMAL(10, 2),
      allowNull: false,
      get() {
        return Number(this.getDataValue('oilWeightG'))
      },
    },
    barsCut: { type: DataTypes.INTEGER, allowNull: false },
    barsKeptBack: { type: DataTypes.INTEGER, allowNull: false },
    keptBackReason: { type: DataTypes.TEXT, allowNull: true },
    ingredientCostCents: { type: DataTypes.INTEGER, allowNull: false },
    costPerBarCents: { type: DataTypes.INTEGER, allowNull: true },
    location: { type: DataTypes.TEXT, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdBy: { type: DataTypes.INTEGER, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'batches' },
)
