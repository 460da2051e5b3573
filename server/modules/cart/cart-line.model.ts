import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import { sequelize } from '@server/db/sequelize'

/** One product in a shop's cart, in whole cases; the cart keeps one line per product. */
export class CartLine extends Model<InferAttributes<CartLine>, InferCreationAttributes<CartLine>> {
  declare shopId: number
  declare productId: number
  declare cases: number
  declare preorder: CreationOptional<boolean>
  declare updatedBy: number | null
  declare updatedAt: CreationOptional<Date>
}

CartLine.init(
  {
    shopId: { type: DataTypes.INTEGER, primaryKey: true },
    productId: { type: DataTypes.INTEGER, primaryKey: true },
    preorder: { type: DataTypes.BOOLEAN, primaryKey: true, defaultValue: false },
    cases: { type: DataTypes.INTEGER, allowNull: false },
    updatedBy: { type: DataTypes.INTEGER, allowNull: true },
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'cart_lines', createdAt: false },
)
