import { QueryTypes } from 'sequelize'
import { AGEING_BUCKETS, ageing, ageingBucket, outstandingCents } from '@shared/domain/invoices/terms'
import type { AgeingBucket, InvoiceAmounts, PaymentTerms } from '@shared/domain/invoices/terms'
import { compareIso } from '@shared/domain/dates/dates'
import { AGEING_BUCKET_LABELS } from '@shared/schemas/payments'
import type { ReceivablesDto, ReceivablesShopDto } from '@shared/schemas/payments'
import { sequelize } from '@server/db/sequelize'
import { studioToday } from '@server/modules/availability/availability.service'
import { getSettings } from '@server/modules/settings/settings.service'

type OpenRow = {
  shop_id: number
  shop_name: string
  payment_terms: PaymentTerms
  total_cents: number
  paid_cents: number
  due_date: string
}

/**
 * What the shops owe as of `today` (the studio's today by default), by days past due: current,
 * 1–30, 31–60, 61–90, over 90 (the domain's `ageing`), in total and per shop, most owed first.
 */
export async function receivables(today?: string): Promise<ReceivablesDto> {
  const [asOf, settings] = await Promise.all([today ?? studioToday(), getSettings()])
  // The open-invoices index covers this: live invoices with money still owed.
  const rows = await sequelize.query<OpenRow>(
    `SELECT i.shop_id, s.trading_name AS shop_name, s.payment_terms, i.total_cents, i.paid_cents, i.due_date
       FROM invoices i JOIN shops s ON s.id = i.shop_id
      WHERE i.kind = 'invoice' AND i.voided_at IS NULL AND i.paid_cents < i.total_cents`,
    { type: QueryTypes.SELECT },
  )
  const amounts = (r: OpenRow): InvoiceAmounts => ({
    totalCents: r.total_cents,
    paidCents: r.paid_cents,
    dueDate: r.due_date,
    voided: false,
  })
  const all = ageing(rows.map(amounts), asOf)
  const counts: Record<AgeingBucket, number> = { current: 0, '1_30': 0, '31_60': 0, '61_90': 0, over_90: 0 }
  for (const r of rows) counts[ageingBucket(r.due_date, asOf)] += 1

  const byShop = new Map<number, OpenRow[]>()
  for (const r of rows) byShop.set(r.shop_id, [...(byShop.get(r.shop_id) ?? []), r])
  const shops: ReceivablesShopDto[] = [...byShop.values()].map((list) => {
    const a = ageing(list.map(amounts), asOf)
    const first = list[0]!
    return {
      shopId: first.shop_id,
      shopName: first.shop_name,
      terms: first.payment_terms,
      byBucket: a.byBucket,
      outstandingCents: a.outstandingCents,
      overdueCents: a.outstandingCents - a.byBucket.current,
      openInvoices: list.filter((r) => outstandingCents(amounts(r)) > 0).length,
      oldestDueDate: list.map((r) => r.due_date).sort(compareIso)[0] ?? null,
    }
  })
  shops.sort((x, y) => y.outstandingCents - x.outstandingCents || x.shopName.localeCompare(y.shopName))
  return {
    asOf,
    currency: settings.currency,
    buckets: AGEING_BUCKETS.map((bucket) => ({
      bucket,
      label: AGEING_BUCKET_LABELS[bucket],
      cents: all.byBucket[bucket],
      invoices: counts[bucket],
    })),
    outstandingCents: all.outstandingCents,
    overdueCents: all.outstandingCents - all.byBucket.current,
    shops,
  }
}
