import type { CertificateStatus } from '@shared/schemas/shops'

/** `GET /api/home/today`: what needs the owner today. */
export type TodayDto = {
  today: string
  weekEnd: string
  applications: number
  ordersToConfirm: number
  packing: { toPack: number; onTheBench: number; packedToShip: number }
  invoices: {
    overdue: { count: number; outstandingCents: number }
    dueThisWeek: { count: number; outstandingCents: number }
  }
  batchesReady: { id: number; lotCode: string; productName: string; readyDate: string; bars: number }[]
  certificates: { shopId: number; tradingName: string; expiresOn: string; status: CertificateStatus }[]
  lowIngredients: {
    ingredientId: number
    name: string
    unit: 'g' | 'each'
    needed: number
    onHand: number
    toBuy: number
  }[]
  poursDue: { productId: number; sku: string; name: string; pourBy: string; late: boolean; moulds: number }[]
}
