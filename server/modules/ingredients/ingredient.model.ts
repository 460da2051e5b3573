import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import type { BaseUnit, IngredientKind } from '@shared/schemas/ingredients'
import { sequelize } from '@server/db/sequelize'

// NUMERIC columns come back from pg as strings; these getters hand out numbers (or null).
const decimal = (precision: number, scale: number, name: string) => ({
  type: DataTypes.DECIMAL(precision, scale),
  allowNull: true,
  get(this: Model) {
    const v = this.getDataValue(name) as string | number | null
    return v === null || v === undefined ? null : Number(v)
  },
})

export class Ingredient extends Model<InferAttributes<Ingredient>, InferCreationAttributes<Ingredient>> {
  declare id: CreationOptional<number>
  declare name: string
  declare kind: IngredientKind
  declare inci: string | null
  /** g NaOH per g of oil. */
  declare sapNaoh: number | null
  /** mg KOH per g of oil. */
  declare sapKoh: number | null
  declare purityPct: number | null
  declare maxUsagePct: number | null
  declare vanillinPct: number | null
  declare unit: BaseUnit
  declare reorderLevel: number | null
  declare notes: string | null
  declare archivedAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Ingredient.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.TEXT, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    inci: { type: DataTypes.TEXT, allowNull: true },
    sapNaoh: decimal(9, 7, 'sapNaoh'),
    sapKoh: decimal(7, 3, 'sapKoh'),
    purityPct: decimal(5, 2, 'purityPct'),
    maxUsagePct: decimal(5, 2, 'maxUsagePct'),
    vanillinPct: decimal(5, 2, 'vanillinPct'),
    unit: { type: DataTypes.TEXT, allowNull: false },
    reorderLevel: decimal(12, 3, 'reorderLevel'),
    notes: { type: DataTypes.TEXT, allowNull: true },
    archivedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'ingredients' },
)
