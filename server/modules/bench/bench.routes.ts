/**
 * The benchmark's bare baselines, served by the same process as the app so that every figure is
 * a ratio measured side by side. Mounted only when LC_BENCH=1 (server/app.ts), never in a normal
 * run: they take no session, no CSRF token and no rights. Each one does the least the matching
 * product route must do:
 * - `GET /api/bench/fixed`: fixed bytes (set once with `PUT`: the catalogue's answer as sent, gzip and all);
 * - `POST /api/bench/order`: the placing transaction's row locks and inserts, straight through pg;
 * - `GET /api/bench/invoice-pdf/:id`: the invoice's document definition, built once, rendered by pdfmake;
 * - `GET /api/bench/memory`: the process's memory by kind (heap, buffers), to tell what a peak is made of;
 * - `POST /api/bench/drain-mail`: waits until the e-mails of the orders placed so far have gone out.
 */
import express, { Router } from 'express'
import pg from 'pg'
import type { TDocumentDefinitions } from 'pdfmake/interfaces.js'
import { env } from '@server/config/env'
import { renderPdf } from '@server/lib/pdf'
import { requireInvoice } from '@server/modules/invoices/invoices.service'
import { drainMail, mailBacklog } from '@server/modules/invoices/mail-queue'
import { getSettings } from '@server/modules/settings/settings.service'
import { invoiceDocument } from '@templates/pdf/invoice'

type BareLine = { productId: number; cases: number }
type BareOrder = { shopId: number; userId: number; key: string; lines: BareLine[] }

/** The same locks and inserts as placing an order, in one pg transaction (no ORM, no checks beyond stock). */
async function bareOrder(pool: pg.Pool, o: BareOrder): Promise<{ status: number; orderId?: number }> {
  const c = await pool.connect()
  try {
    await c.query('BEGIN')
    const shop = await c.query('SELECT id, tier_id FROM shops WHERE id = $1 FOR NO KEY UPDATE', [o.shopId])
    const tierId = shop.rows[0]?.tier_id as number
    await c.query('SELECT id FROM orders WHERE shop_id = $1 AND idempotency_key = $2', [o.shopId, o.key])
    const ids = o.lines.map((l) => l.productId)
    const products = await c.query(
      `SELECT p.id, p.sku, p.name, p.case_pack, p.net_weight_g, min(b.unit_price_cents)::int AS price
         FROM products p JOIN price_breaks b ON b.product_id = p.id AND b.tier_id = $1
        WHERE p.id = ANY($2::int[]) GROUP BY p.id`,
      [tierId, ids],
    )
    const byId = new Map(products.rows.map((p) => [p.id as number, p]))
    const batches = await c.query(
      `SELECT s.batch_id, b.product_id, s.free FROM batch_stock s JOIN batches b ON b.id = s.batch_id
        WHERE b.product_id = ANY($1::int[]) AND b.ready_date <= current_date AND s.free > 0
        ORDER BY b.ready_date, b.id FOR UPDATE OF s`,
      [ids],
    )
    const lines = o.lines.map((l, i) => {
      const p = byId.get(l.productId)
      const bars = l.cases * (p.case_pack as number)
      return { ...l, p, bars, sort: i }
    })
    const allocations: { line: number; batchId: number; bars: number }[] = []
    for (const l of lines) {
      let need = l.bars
      for (const b of batches.rows) {
        if (need === 0) break
        if (b.product_id !== l.productId || b.free === 0) continue
        const take = Math.min(need, b.free as number)
        b.free -= take
        need -= take
        allocations.push({ line: l.sort, batchId: b.batch_id, bars: take })
      }
      if (need > 0) {
        await c.query('ROLLBACK')
        return { status: 409 }
      }
    }
    const year = new Date().getUTCFullYear()
    const seq = await c.query(
      `INSERT INTO order_sequences (year, last) VALUES ($1, 1)
       ON CONFLICT (year) DO UPDATE SET last = order_sequences.last + 1 RETURNING last`,
      [year],
    )
    const last = seq.rows[0].last as number
    const subtotal = lines.reduce((s, l) => s + l.bars * (l.p.price as number), 0)
    const weight = lines.reduce((s, l) => s + l.bars * (l.p.net_weight_g as number), 0)
    const order = await c.query(
      `INSERT INTO orders (number, year, seq, shop_id, placed_by, status, subtotal_cents, shipping_cents,
                           tax_cents, total_cents, weight_g, idempotency_key)
       VALUES ($1, $2, $3, $4, $5, 'placed', $6, 0, 0, $6, $7, $8) RETURNING id`,
      [
        `O${String(year % 100).padStart(2, '0')}-${String(last).padStart(5, '0')}`,
        year,
        last,
        o.shopId,
        o.userId,
        subtotal,
        weight,
        o.key,
      ],
    )
    const orderId = order.rows[0].id as number
    const lineIds: number[] = []
    for (const l of lines) {
      const r = await c.query(
        `INSERT INTO order_lines (order_id, product_id, sku, name, cases, case_pack, bars, unit_price_cents,
                                  line_total_cents, sort_order)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10) RETURNING id`,
        [
          orderId,
          l.productId,
          l.p.sku,
          l.p.name,
          l.cases,
          l.p.case_pack,
          l.bars,
          l.p.price,
          l.bars * l.p.price,
          l.sort,
        ],
      )
      lineIds.push(r.rows[0].id as number)
    }
    for (const a of allocations) {
      const lineId = lineIds[a.line]!
      await c.query('INSERT INTO allocations (order_line_id, batch_id, bars) VALUES ($1, $2, $3)', [
        lineId,
        a.batchId,
        a.bars,
      ])
      await c.query('SELECT free, reserved FROM batch_stock WHERE batch_id = $1 FOR UPDATE', [a.batchId])
      await c.query(
        `INSERT INTO stock_moves (batch_id, kind, bars, free_delta, reserved_delta, order_id, order_line_id, user_id)
         VALUES ($1, 'reserved', $2, $3, $2, $4, $5, $6)`,
        [a.batchId, a.bars, -a.bars, orderId, lineId, o.userId],
      )
    }
    await c.query('DELETE FROM cart_lines WHERE shop_id = $1 AND product_id = ANY($2::int[])', [
      o.shopId,
      ids,
    ])
    await c.query(
      `INSERT INTO audit_events (user_id, action, entity, entity_id, data) VALUES ($1, 'order.placed', 'order', $2, $3)`,
      [o.userId, orderId, JSON.stringify({ number: last, totalCents: subtotal })],
    )
    await c.query('COMMIT')
    return { status: 201, orderId }
  } catch (err) {
    await c.query('ROLLBACK').catch(() => {})
    throw err
  } finally {
    c.release()
  }
}

export function benchRoutes() {
  const r = Router()
  const pool = new pg.Pool({ connectionString: env.DATABASE_URL, max: env.DB_POOL_MAX })
  let fixed: { bytes: Buffer; encoding: string } = {
    bytes: Buffer.from('{"items":[]}'),
    encoding: 'identity',
  }
  const pdfDocs = new Map<number, TDocumentDefinitions>()

  r.put('/fixed', express.raw({ type: () => true, limit: '8mb' }), (req, res) => {
    fixed = { bytes: req.body as Buffer, encoding: req.get('x-bench-encoding') ?? 'identity' }
    res.status(204).end()
  })
  r.get('/fixed', (_req, res) => {
    res.type('application/json').set('Content-Encoding', fixed.encoding).send(fixed.bytes)
  })
  r.post('/order', express.json(), async (req, res) => {
    const out = await bareOrder(pool, req.body as BareOrder)
    res
      .status(out.status)
      .json(out.orderId ? { order: { id: out.orderId } } : { error: { code: 'insufficient_stock' } })
  })
  r.get('/memory', (_req, res) => {
    const mb = (n: number) => Math.round((n / 1024 / 1024) * 10) / 10
    const m = process.memoryUsage()
    res.json({
      rssMb: mb(m.rss),
      heapTotalMb: mb(m.heapTotal),
      heapUsedMb: mb(m.heapUsed),
      externalMb: mb(m.external),
      arrayBuffersMb: mb(m.arrayBuffers),
      mailBacklog: mailBacklog(),
    })
  })
  r.post('/drain-mail', async (_req, res) => {
    const t0 = performance.now()
    const left = await drainMail(120_000)
    res.json({ waitedMs: Math.round(performance.now() - t0), left })
  })
  r.get('/invoice-pdf/:id', async (req, res) => {
    const id = Number(req.params.id)
    let doc = pdfDocs.get(id)
    if (!doc) {
      const invoice = await requireInvoice(id, { role: 'owner', shopId: null })
      doc = invoiceDocument({ studio: (await getSettings()).studio, invoice })
      pdfDocs.set(id, doc)
    }
    res.type('application/pdf').send(await renderPdf(doc))
  })
  return r
}
