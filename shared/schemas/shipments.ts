import { z } from 'zod'
import { compareIso, isValidIsoDate } from '@shared/domain/dates/dates'
import { latestTodayOnEarth } from '@shared/schemas/batches'

/** Carriers the ship form suggests; any other name may be typed. */
export const COMMON_CARRIERS = ['UPS', 'USPS', 'FedEx', 'DHL', 'Local courier', 'Customer pick-up'] as const

const text = (what: string, max: number) =>
  z
    .string({ error: `Enter the ${what}.` })
    .trim()
    .min(1, `Enter the ${what}.`)
    .max(max, `The ${what} has at most ${max} characters.`)

/**
 * `POST /api/orders/:id/ship`. The date may not be in the future anywhere on Earth here; the
 * server then holds it to the studio's own today and to the day the order was placed.
 */
export const ShipOrderSchema = z.object({
  carrier: text('carrier', 60),
  trackingNumber: text('tracking number', 80).refine(
    (v) => /^[A-Za-z0-9][A-Za-z0-9 \-./#]*$/.test(v),
    'A tracking number has letters, digits, spaces and - . / # only.',
  ),
  shipDate: z
    .string({ error: 'Enter the ship date.' })
    .trim()
    .refine(isValidIsoDate, 'Enter the ship date as a calendar date (YYYY-MM-DD).')
    .refine(
      (d) => !isValidIsoDate(d) || compareIso(d, latestTodayOnEarth()) <= 0,
      'The ship date cannot be in the future.',
    ),
})
export type ShipOrderInput = z.input<typeof ShipOrderSchema>
export type ShipOrder = z.output<typeof ShipOrderSchema>

/** `POST /api/orders/:id/ship` → 200. */
export type ShipResultDto = {
  order: { id: number; number: string; status: 'shipped' }
  shipment: {
    carrier: string
    trackingNumber: string
    shipDate: string
    cartons: number
    weightG: number
  }
  /** The invoice raised by this shipment, or the one already raised for a prepay account. */
  invoice: { id: number; number: string; raisedNow: boolean } | null
}
