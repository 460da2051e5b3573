import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import type { PurchaseUnit } from '@shared/schemas/ingredients'
import { sequelize } from '@server/db/sequelize'

// NUMERIC columns come back from pg as strings; the getters hand out numbers.
const decimal = (precision: number, scale: number, name: string) => ({
  type: DataTypes.DECIMAL(precision, scale),
  allowNull: false,
  get(this: Model) {
    return Number(this.getDataValue(name))
  },
})

/** One purchase of an ingredient (a lot): quantity and remaining in the ingredient's base unit. */
export class IngredientLot extends Model<
  InferAttributes<IngredientLot>,
  InferCreationAttributes<IngredientLot>
> {
  declare id: CreationOptional<number>
  declare ingredientId: number
  declare supplier: string
  declare supplierLotCode: string | null
  /** YYYY-MM-DD */
  declare receivedOn: string
  declare enteredQuantity: number
  declare enteredUnit: PurchaseUnit
  declare quantity: number
  declare remaining: number
  declare costCents: number
  declare freightCents: number
  declare notes: string | null
  declare createdBy: number | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

IngredientLot.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    ingredientId: { type: DataTypes.INTEGER, allowNull: false },
    supplier: { type: DataTypes.TEXT, allowNull: false },
    supplierLotCode: { type: DataTypes.TEXT, allowNull: true },
    receivedOn: { type: DataTypes.DATEONLY, allowNull: false },
    enteredQuantity: decimal(12, 3, 'enteredQuantity'),
    enteredUnit: { type: DataTypes.TEXT, allowNull: false },
    quantity: decimal(14, 4, 'quantity'),
    remaining: decimal(14, 4, 'remaining'),
    costCents: { type: DataTypes.INTEGER, allowNull: false },
    freightCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdBy: { type: DataTypes.INTEGER, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'ingredient_lots' },
)
