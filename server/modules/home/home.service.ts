import { QueryTypes } from 'sequelize'
import { addDays, compareIso } from '@shared/domain/dates/dates'
import { CERTIFICATE_WARNING_DAYS, certificateStatus } from '@shared/domain/shops/certificate'
import type { TodayDto } from '@shared/schemas/home'
import { PlanQuerySchema } from '@shared/schemas/planning'
import { sequelize } from '@server/db/sequelize'
import { studioToday } from '@server/modules/availability/availability.service'
import { buildPourPlan } from '@server/modules/planning/planning.service'

// The owner's "today": the counts come from one query, batches turning ready and certificates
// from one each, and the ingredients and pours from the pour plan at its default settings
// (the same numbers the plan screen opens with). "This week" is today and the six days after.

export async function today(): Promise<TodayDto> {
  const day = await studioToday()
  const weekEnd = addDays(day, 6)
  const [counts] = await sequelize.query<{
    applications: number
    to_confirm: number
    to_pack: number
    on_bench: number
    packed: number
    overdue_n: number
    overdue_cents: number
    due_n: number
    due_cents: number
  }>(
    `SELECT (SELECT COUNT(*) FROM shops WHERE status = 'applied')::int AS applications,
            (SELECT COUNT(*) FROM orders WHERE status = 'placed')::int AS to_confirm,
            (SELECT COUNT(*) FROM orders WHERE status = 'confirmed')::int AS to_pack,
            (SELECT COUNT(*) FROM orders WHERE status = 'packing')::int AS on_bench,
            (SELECT COUNT(*) FROM orders WHERE status = 'packed')::int AS packed,
            COUNT(*) FILTER (WHERE i.due_date < $1::date)::int AS overdue_n,
            COALESCE(SUM(i.total_cents - i.paid_cents) FILTER (WHERE i.due_date < $1::date), 0)::int AS overdue_cents,
            COUNT(*) FILTER (WHERE i.due_date BETWEEN $1::date AND $2::date)::int AS due_n,
            COALESCE(SUM(i.total_cents - i.paid_cents) FILTER (WHERE i.due_date BETWEEN $1::date AND $2::date), 0)::int AS due_cents
       FROM invoices i
      WHERE i.kind = 'invoice' AND i.voided_at IS NULL AND i.paid_cents < i.total_cents`,
    { bind: [day, weekEnd], type: QueryTypes.SELECT },
  )
  const batches = await sequelize.query<{
    id: number
    lot_code: string
    product_name: string
    ready_date: string
    bars: number
  }>(
    `SELECT b.id, b.lot_code, p.name AS product_name, b.ready_date, s.free AS bars
       FROM batches b JOIN products p ON p.id = b.product_id JOIN batch_stock s ON s.batch_id = b.id
      WHERE b.ready_date BETWEEN $1::date AND $2::date AND s.free > 0
      ORDER BY b.ready_date, b.id`,
    { bind: [day, weekEnd], type: QueryTypes.SELECT },
  )
  const certificates = await sequelize.query<{
    id: number
    trading_name: string
    certificate_expires_on: string
  }>(
    `SELECT id, trading_name, certificate_expires_on FROM shops
      WHERE status IN ('active', 'on_hold') AND certificate_upload_id IS NOT NULL
        AND certificate_expires_on <= $1::date
      ORDER BY certificate_expires_on, id`,
    { bind: [addDays(day, CERTIFICATE_WARNING_DAYS)], type: QueryTypes.SELECT },
  )
  const plan = await buildPourPlan(PlanQuerySchema.parse({}))
  const c = counts!
  return {
    today: day,
    weekEnd,
    applications: c.applications,
    ordersToConfirm: c.to_confirm,
    packing: { toPack: c.to_pack, onTheBench: c.on_bench, packedToShip: c.packed },
    invoices: {
      overdue: { count: c.overdue_n, outstandingCents: c.overdue_cents },
      dueThisWeek: { count: c.due_n, outstandingCents: c.due_cents },
    },
    batchesReady: batches.map((b) => ({
      id: b.id,
      lotCode: b.lot_code,
      productName: b.product_name,
      readyDate: b.ready_date,
      bars: b.bars,
    })),
    certificates: certificates.map((s) => ({
      shopId: s.id,
      tradingName: s.trading_name,
      expiresOn: s.certificate_expires_on,
      status: certificateStatus(true, s.certificate_expires_on, day),
    })),
    lowIngredients: plan.ingredients
      .filter((i) => i.toBuy > 0)
      .map(({ ingredientId, name, unit, needed, onHand, toBuy }) => ({
        ingredientId,
        name,
        unit,
        needed,
        onHand,
        toBuy,
      })),
    poursDue: plan.products
      .filter((p) => p.suggestion && compareIso(p.suggestion.pourBy, weekEnd) <= 0)
      .map((p) => ({
        productId: p.productId,
        sku: p.sku,
        name: p.name,
        pourBy: p.suggestion!.pourBy,
        late: p.suggestion!.late,
        moulds: p.suggestion!.moulds,
      })),
  }
}
