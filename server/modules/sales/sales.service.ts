import { QueryTypes } from 'sequelize'
import { toCsv } from '@shared/domain/csv/csv'
import type { SalesGroup, SalesQuery, SalesReport, SalesRow } from '@shared/schemas/sales'
import { SALES_GROUP_LABELS } from '@shared/schemas/sales'
import { sequelize } from '@server/db/sequelize'
import { spreadsheetSafe } from '@server/modules/invoices/spreadsheet'
import { getSettings } from '@server/modules/settings/settings.service'

// Sales are the lines of shipped orders, dated by the studio day they shipped: what left the
// studio and was invoiced. Revenue is the merchandise on the line (shipping and tax are not
// sales of a product); the cost is that of the bars that left, from the ledger's `shipped` moves
// times the cost per bar frozen on each batch at pouring. A tier is the shop's tier now.

const GROUP_SQL: Record<SalesGroup, { key: string; label: string }> = {
  product: { key: 'x.product_id', label: "x.name || ' (' || x.sku || ')'" },
  tier: { key: 't.id', label: "COALESCE(t.name, 'No tier')" },
  shop: { key: 's.id', label: 's.trading_name' },
}

export async function salesReport(q: SalesQuery): Promise<SalesReport> {
  const { timeZone } = await getSettings()
  const g = GROUP_SQL[q.by]
  const rows = await sequelize.query<{
    key: number | null
    label: string
    orders: number
    bars: number
    revenue: number
    cost: number
  }>(
    `WITH x AS (
       SELECT l.product_id, l.sku, l.name, l.bars, l.line_total_cents, o.id AS order_id, o.shop_id,
              COALESCE((SELECT SUM(abs(m.bars) * COALESCE(b.cost_per_bar_cents, 0))
                          FROM stock_moves m JOIN batches b ON b.id = m.batch_id
                         WHERE m.order_line_id = l.id AND m.kind = 'shipped'), 0) AS cost
         FROM order_lines l JOIN orders o ON o.id = l.order_id
        WHERE o.status = 'shipped' AND l.removed_at IS NULL
          AND (o.shipped_at AT TIME ZONE $3)::date BETWEEN $1::date AND $2::date
     )
     SELECT ${g.key} AS key, ${g.label} AS label, COUNT(DISTINCT x.order_id)::int AS orders,
            SUM(x.bars)::int AS bars, SUM(x.line_total_cents)::bigint AS revenue, ROUND(SUM(x.cost))::bigint AS cost
       FROM x JOIN shops s ON s.id = x.shop_id LEFT JOIN price_tiers t ON t.id = s.tier_id
      GROUP BY 1, 2
      ORDER BY revenue DESC, label`,
    { bind: [q.from, q.to, timeZone], type: QueryTypes.SELECT },
  )
  const toRow = (r: {
    key: number | null
    label: string
    orders: number
    bars: number
    revenue: number
    cost: number
  }): SalesRow => {
    const revenueCents = Number(r.revenue)
    const costCents = Number(r.cost)
    const marginCents = revenueCents - costCents
    return {
      key: r.key,
      label: r.label,
      orders: r.orders,
      bars: r.bars,
      revenueCents,
      costCents,
      marginCents,
      marginPct: revenueCents > 0 ? Math.round((marginCents / revenueCents) * 1000) / 10 : null,
    }
  }
  const list = rows.map(toRow)
  // An order with lines of several products counts once in the total.
  const [all] = await sequelize.query<{ orders: number }>(
    `SELECT COUNT(*)::int AS orders FROM orders o
      WHERE o.status = 'shipped' AND (o.shipped_at AT TIME ZONE $3)::date BETWEEN $1::date AND $2::date`,
    { bind: [q.from, q.to, timeZone], type: QueryTypes.SELECT },
  )
  const sum = (f: (r: SalesRow) => number) => list.reduce((n, r) => n + f(r), 0)
  const revenueCents = sum((r) => r.revenueCents)
  const costCents = sum((r) => r.costCents)
  return {
    from: q.from,
    to: q.to,
    by: q.by,
    rows: list,
    totals: {
      orders: all?.orders ?? 0,
      bars: sum((r) => r.bars),
      revenueCents,
      costCents,
      marginCents: revenueCents - costCents,
      marginPct:
        revenueCents > 0 ? Math.round(((revenueCents - costCents) / revenueCents) * 1000) / 10 : null,
    },
  }
}

const dollars = (cents: number) => (cents / 100).toFixed(2)

export function salesCsv(report: SalesReport): string {
  return toCsv([
    [SALES_GROUP_LABELS[report.by], 'Orders', 'Bars', 'Revenue', 'Cost of bars', 'Margin', 'Margin %'],
    ...report.rows.map((r) => [
      spreadsheetSafe(r.label),
      String(r.orders),
      String(r.bars),
      dollars(r.revenueCents),
      dollars(r.costCents),
      dollars(r.marginCents),
      r.marginPct === null ? '' : r.marginPct.toFixed(1),
    ]),
    [
      'Total',
      String(report.totals.orders),
      String(report.totals.bars),
      dollars(report.totals.revenueCents),
      dollars(report.totals.costCents),
      dollars(report.totals.marginCents),
      report.totals.marginPct === null ? '' : report.totals.marginPct.toFixed(1),
    ],
  ])
}
