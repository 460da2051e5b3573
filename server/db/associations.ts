// Model associations live here, imported once by the app, so model files stay free of cycles.
import { Shop } from '@server/modules/shops/shop.model'
import { User } from '@server/modules/users/user.model'

User.belongsTo(Shop, { foreignKey: 'shopId', as: 'shop' })
Shop.hasMany(User, { foreignKey: 'shopId', as: 'users' })
