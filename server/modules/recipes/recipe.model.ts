import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import type { WaterMode } from '@shared/schemas/recipes'
import { sequelize } from '@server/db/sequelize'

/** numeric columns come back from pg as strings: these getters hand out numbers (or null). */
function numberGetter<M extends Model>(field: string) {
  return function (this: M) {
    const v = this.getDataValue(field as never) as unknown
    return v == null ? null : Number(v)
  }
}

export class RecipeModel extends Model<InferAttributes<RecipeModel>, InferCreationAttributes<RecipeModel>> {
  declare id: CreationOptional<number>
  declare name: string
  declare notes: string | null
  declare superfatPct: number
  declare waterMode: WaterMode
  declare lyeConcentrationPct: number | null
  declare waterLyeRatio: number | null
  declare lyeIngredientId: number | null
  declare waterIngredientId: number | null
  declare labourMinutes: number
  declare cureDays: number
  declare barWeightG: number
  declare barsPerMould: number
  declare barsKeptBack: number
  declare mouldOilWeightG: number
  declare archivedAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

RecipeModel.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.TEXT, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    superfatPct: { type: DataTypes.DECIMAL(5, 2), allowNull: false, get: numberGetter('superfatPct') },
    waterMode: { type: DataTypes.TEXT, allowNull: false },
    lyeConcentrationPct: {
      type: DataTypes.DECIMAL(5, 2),
      allowNull: true,
      get: numberGetter('lyeConcentrationPct'),
    },
    waterLyeRatio: { type: DataTypes.DECIMAL(5, 3), allowNull: true, get: numberGetter('waterLyeRatio') },
    lyeIngredientId: { type: DataTypes.INTEGER, allowNull: true },
    waterIngredientId: { type: DataTypes.INTEGER, allowNull: true },
    labourMinutes: { type: DataTypes.INTEGER, allowNull: false },
    cureDays: { type: DataTypes.INTEGER, allowNull: false },
    barWeightG: { type: DataTypes.DECIMAL(8, 2), allowNull: false, get: numberGetter('barWeightG') },
    barsPerMould: { type: DataTypes.INTEGER, allowNull: false },
    barsKeptBack: { type: DataTypes.INTEGER, allowNull: false },
    mouldOilWeightG: {
      type: DataTypes.DECIMAL(10, 2),
      allowNull: false,
      get: numberGetter('mouldOilWeightG'),
    },
    archivedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'recipes' },
)

export type RecipeItemRole = 'oil' | 'fragrance' | 'additive' | 'packaging'

export class RecipeItemModel extends Model<
  InferAttributes<RecipeItemModel>,
  InferCreationAttributes<RecipeItemModel>
> {
  declare id: CreationOptional<number>
  declare recipeId: number
  declare ingredientId: number
  declare role: RecipeItemRole
  declare pctOfOils: number | null
  declare gPerKgOils: number | null
  declare qtyPerBar: number | null
  declare sortOrder: number
}

RecipeItemModel.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    recipeId: { type: DataTypes.INTEGER, allowNull: false },
    ingredientId: { type: DataTypes.INTEGER, allowNull: false },
    role: { type: DataTypes.TEXT, allowNull: false },
    pctOfOils: { type: DataTypes.DECIMAL(7, 3), allowNull: true, get: numberGetter('pctOfOils') },
    gPerKgOils: { type: DataTypes.DECIMAL(9, 3), allowNull: true, get: numberGetter('gPerKgOils') },
    qtyPerBar: { type: DataTypes.DECIMAL(9, 3), allowNull: true, get: numberGetter('qtyPerBar') },
    sortOrder: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
  },
  { sequelize, tableName: 'recipe_items', timestamps: false },
)
