import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import { sequelize } from '@server/db/sequelize'

export class Product extends Model<InferAttributes<Product>, InferCreationAttributes<Product>> {
  declare id: CreationOptional<number>
  declare sku: string
  declare name: string
  declare scentNotes: string | null
  declare description: string | null
  declare photoUploadId: number | null
  declare recipeId: number
  declare netWeightG: number
  declare cutWeightG: number
  declare casePack: number
  declare msrpCents: number
  declare gtin: string | null
  declare declaration: CreationOptional<string | null>
  declare declarationConfirmedAt: CreationOptional<Date | null>
  declare active: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Product.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    sku: { type: DataTypes.TEXT, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    scentNotes: { type: DataTypes.TEXT, allowNull: true },
    description: { type: DataTypes.TEXT, allowNull: true },
    photoUploadId: { type: DataTypes.INTEGER, allowNull: true },
    recipeId: { type: DataTypes.INTEGER, allowNull: false },
    netWeightG: { type: DataTypes.INTEGER, allowNull: false },
    cutWeightG: { type: DataTypes.INTEGER, allowNull: false },
    casePack: { type: DataTypes.INTEGER, allowNull: false },
    msrpCents: { type: DataTypes.INTEGER, allowNull: false },
    gtin: { type: DataTypes.TEXT, allowNull: true },
    declaration: { type: DataTypes.TEXT, allowNull: true },
    declarationConfirmedAt: { type: DataTypes.DATE, allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'products' },
)
