import { QueryTypes } from 'sequelize'
import { compareIso, isoToday } from '@shared/domain/dates/dates'
import type { ShipOrder, ShipResultDto } from '@shared/schemas/shipments'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import { audit } from '@server/modules/audit/audit.service'
import { studioToday } from '@server/modules/availability/availability.service'
import { recordStockMove } from '@server/modules/batches/stock-moves.service'
import { raiseInvoiceForOrder } from '@server/modules/invoices/invoices.service'
import { holdMail } from '@server/modules/invoices/mail-queue'
import { keepMail } from '@server/modules/mail/outbox'
import { awaitingPaymentSql } from '@server/modules/invoices/prepay-payment'
import { retryingTransaction } from '@server/modules/orders/transactions'
import { lockOrder, nextStatus } from '@server/modules/packing/packing.service'
import type { PackingUser } from '@server/modules/packing/packing.service'
import { getSettings } from '@server/modules/settings/settings.service'

export type ShipOptions = {
  /** E-mail the buyer (tracking and packing slip; the invoice) after the commit. Default true. */
  notify?: boolean
}

/**
 * Ships a packed order in one transaction: the order row is locked, the shipment written, every
 * allocation turned from reserved into a `shipped` ledger move (batches locked in ready-date
 * order, as placing an order locks them, so two writers never wait on each other crosswise), the order marked shipped and its invoice raised
 * with the next gapless number of the ship date's year (unless a prepay account's invoice was
 * raised at confirmation: that order ships only once the invoice is paid in full, else 409
 * `awaiting_payment`). A failure anywhere rolls all of it back, the invoice number included.
 * The buyer is e-mailed after the commit.
 */
export async function shipOrder(
  orderId: number,
  input: ShipOrder,
  user: PackingUser,
  opts: ShipOptions = {},
): Promise<ShipResultDto> {
  const { timeZone } = await getSettings()
  const today = await studioToday()
  if (compareIso(input.shipDate, today) > 0) {
    throw AppError.field('shipDate', `The ship date cannot be after today (${today}).`)
  }
  const result = await holdMail(() =>
    retryingTransaction(async (t) => {
      const o = await lockOrder(orderId, t)
      const to = nextStatus(o, 'ship', user)
      const [order] = await sequelize.query<{ cartons: number; packed_weight_g: number; created_at: Date }>(
        'SELECT cartons, packed_weight_g, created_at FROM orders WHERE id = $1',
        { bind: [orderId], type: QueryTypes.SELECT, transaction: t },
      )
      const [existing] = await sequelize.query<{ id: number; number: string; awaiting_payment: boolean }>(
        `SELECT id, number, ${awaitingPaymentSql('$1')} AS awaiting_payment
           FROM invoices WHERE order_id = $1 AND kind = 'invoice' AND voided_at IS NULL`,
        { bind: [orderId], type: QueryTypes.SELECT, transaction: t },
      )
      if (existing?.awaiting_payment) {
        // No amounts: a packer may be the one asking.
        throw AppError.conflict(
          'awaiting_payment',
          `Order ${o.number} is on prepay terms and invoice ${existing.number} is not yet paid in full: it ships once the studio records the payment.`,
          [
            {
              field: 'invoice',
              message: `Invoice ${existing.number} awaits payment.`,
              invoiceId: existing.id,
              invoiceNumber: existing.number,
            },
          ],
        )
      }
      const placedOn = isoToday(order!.created_at, timeZone)
      if (compareIso(input.shipDate, placedOn) < 0) {
        throw AppError.field(
          'shipDate',
          `The order was placed on ${placedOn}; it cannot have shipped before that.`,
        )
      }
      await sequelize.query(
        `INSERT INTO shipments (order_id, carrier, tracking_number, ship_date, cartons, weight_g, created_by)
       VALUES ($1, $2, $3, $4, $5, $6, $7)`,
        {
          bind: [
            orderId,
            input.carrier,
            input.trackingNumber,
            input.shipDate,
            order!.cartons,
            order!.packed_weight_g,
            user.id,
          ],
          transaction: t,
        },
      )
      await sequelize.query(
        'UPDATE orders SET status = $2, shipped_at = now(), updated_at = now() WHERE id = $1',
        { bind: [orderId, to], transaction: t },
      )
      const allocations = await sequelize.query<{ order_line_id: number; batch_id: number; bars: number }>(
        `SELECT a.order_line_id, a.batch_id, a.bars
         FROM allocations a
         JOIN order_lines l ON l.id = a.order_line_id AND l.removed_at IS NULL
         JOIN batches b ON b.id = a.batch_id
        WHERE l.order_id = $1
        ORDER BY b.ready_date, b.id, a.order_line_id`,
        { bind: [orderId], type: QueryTypes.SELECT, transaction: t },
      )
      await audit(
        {
          userId: user.id,
          action: 'order.shipped',
          entity: 'order',
          entityId: orderId,
          data: { carrier: input.carrier, trackingNumber: input.trackingNumber, shipDate: input.shipDate },
        },
        t,
      )
      // The contended locks come last: the batches' stock rows, then the year's invoice number.
      for (const a of allocations) {
        await recordStockMove(
          {
            batchId: a.batch_id,
            kind: 'shipped',
            bars: a.bars,
            orderId,
            orderLineId: a.order_line_id,
            userId: user.id,
          },
          t,
        )
      }
      const raised = existing
        ? null
        : await raiseInvoiceForOrder(orderId, t, {
            issueDate: input.shipDate,
            userId: user.id,
            notify: opts.notify,
          })
      // After the invoice's own e-mail: the buyer hears of the invoice, then of the parcel.
      if (opts.notify !== false) await keepMail([{ kind: 'shipment', orderId }], t)
      return {
        order: { id: orderId, number: o.number, status: 'shipped' as const },
        shipment: {
          carrier: input.carrier,
          trackingNumber: input.trackingNumber,
          shipDate: input.shipDate,
          cartons: order!.cartons,
          weightG: order!.packed_weight_g,
        },
        invoice: raised
          ? { id: raised.id, number: raised.number, raisedNow: true }
          : existing
            ? { id: existing.id, number: existing.number, raisedNow: false }
            : null,
      }
    }),
  )
  return result
}
