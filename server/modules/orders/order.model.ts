import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import type { OrderStatus } from '@shared/domain/orders/order-status'
import { sequelize } from '@server/db/sequelize'

/** A shop's case order. Lines, allocations and totals are written by orders.service in one transaction. */
export class Order extends Model<InferAttributes<Order>, InferCreationAttributes<Order>> {
  declare id: CreationOptional<number>
  declare number: string
  declare year: number
  declare seq: number
  declare shopId: number
  declare placedBy: number | null
  declare poNumber: string | null
  declare note: string | null
  declare status: CreationOptional<OrderStatus>
  declare requestedShipDate: string | null
  declare isOpeningOrder: CreationOptional<boolean>
  declare subtotalCents: number
  declare shippingCents: CreationOptional<number>
  declare taxCents: CreationOptional<number>
  declare totalCents: number
  declare weightG: CreationOptional<number>
  declare taxExempt: CreationOptional<boolean>
  /** numeric(5,2): pg returns it as a string; the getter hands out a number. */
  declare taxRatePct: CreationOptional<number>
  declare idempotencyKey: string | null
  declare requestHash: string | null
  declare confirmedAt: CreationOptional<Date | null>
  declare confirmedBy: CreationOptional<number | null>
  declare cancelledAt: CreationOptional<Date | null>
  declare cancelledBy: CreationOptional<number | null>
  declare cancelReason: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Order.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    number: { type: DataTypes.TEXT, allowNull: false },
    year: { type: DataTypes.INTEGER, allowNull: false },
    seq: { type: DataTypes.INTEGER, allowNull: false },
    shopId: { type: DataTypes.INTEGER, allowNull: false },
    placedBy: { type: DataTypes.INTEGER, allowNull: true },
    poNumber: { type: DataTypes.TEXT, allowNull: true },
    note: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'placed' },
    requestedShipDate: { type: DataTypes.DATEONLY, allowNull: true },
    isOpeningOrder: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    subtotalCents: { type: DataTypes.INTEGER, allowNull: false },
    shippingCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    taxCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    totalCents: { type: DataTypes.INTEGER, allowNull: false },
    weightG: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    taxExempt: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    taxRatePct: {
      type: DataTypes.DECIMAL(5, 2),
      allowNull: false,
      defaultValue: 0,
      get() {
        return Number(this.getDataValue('taxRatePct'))
      },
    },
    idempotencyKey: { type: DataTypes.TEXT, allowNull: true },
    requestHash: { type: DataTypes.CHAR(64), allowNull: true },
    confirmedAt: { type: DataTypes.DATE, allowNull: true },
    confirmedBy: { type: DataTypes.INTEGER, allowNull: true },
    cancelledAt: { type: DataTypes.DATE, allowNull: true },
    cancelledBy: { type: DataTypes.INTEGER, allowNull: true },
    cancelReason: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'orders' },
)
