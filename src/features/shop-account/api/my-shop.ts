import { useQuery } from '@tanstack/react-query'
import type { ShopSummary } from '@shared/schemas/shops'
import { api } from '@/lib/api-client'

export const myShopKeys = { all: ['my-shop'] as const }

export const useMyShop = () =>
  useQuery({
    queryKey: myShopKeys.all,
    queryFn: async () => (await api<{ shop: ShopSummary }>('/shops/mine')).shop,
  })
