import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes } from 'sequelize'
import type { Address, PaymentTerms, ShopStatus } from '@shared/schemas/shops'
import { sequelize } from '@server/db/sequelize'

export class Shop extends Model<InferAttributes<Shop>, InferCreationAttributes<Shop>> {
  declare id: CreationOptional<number>
  declare legalName: string
  declare tradingName: string
  declare contactName: string
  declare contactEmail: string
  declare contactPhone: string | null
  declare billingAddress: Address
  declare shippingAddress: Address
  declare taxId: string | null
  declare certificateUploadId: number | null
  declare certificateExpiresOn: string | null
  declare tierId: number | null
  declare paymentTerms: CreationOptional<PaymentTerms>
  declare status: CreationOptional<ShopStatus>
  declare openingOrderDone: CreationOptional<boolean>
  declare storeType: string | null
  declare website: string | null
  declare notes: string | null
  declare declineReason: string | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Shop.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    legalName: { type: DataTypes.TEXT, allowNull: false },
    tradingName: { type: DataTypes.TEXT, allowNull: false },
    contactName: { type: DataTypes.TEXT, allowNull: false },
    contactEmail: { type: DataTypes.TEXT, allowNull: false },
    contactPhone: { type: DataTypes.TEXT, allowNull: true },
    billingAddress: { type: DataTypes.JSONB, allowNull: false },
    shippingAddress: { type: DataTypes.JSONB, allowNull: false },
    taxId: { type: DataTypes.TEXT, allowNull: true },
    certificateUploadId: { type: DataTypes.INTEGER, allowNull: true },
    certificateExpiresOn: { type: DataTypes.DATEONLY, allowNull: true },
    tierId: { type: DataTypes.INTEGER, allowNull: true },
    paymentTerms: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'prepay' },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'applied' },
    openingOrderDone: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    storeType: { type: DataTypes.TEXT, allowNull: true },
    website: { type: DataTypes.TEXT, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    declineReason: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'shops' },
)
