/**
 * The mail outbox: the e-mails a change owes are written by its transaction, deleted once the
 * relay has taken them, kept with their error when it refused them, sent again when due (after a
 * refusal's wait, or when their own process ended before sending), and given up after the last try.
 * The relay is the test mail catcher behind a transport that refuses as many sends as asked.
 */
import { randomUUID } from 'node:crypto'
import type Nodemailer from 'nodemailer'
import { QueryTypes } from 'sequelize'
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { drainMail } from '@server/modules/invoices/mail-queue'
import { LEASE_SECONDS, MAX_ATTEMPTS, sendDueMail } from '@server/modules/mail/outbox'
import { updateSettings } from '@server/modules/settings/settings.service'
import { studioToday } from '@server/modules/availability/availability.service'
import { clientAs } from '@tests/factories/api-client'
import type { ApiClient } from '@tests/factories/api-client'
import { allMail, waitForMail } from '@tests/factories/mail'
import { makeOrder, makeSellable } from '@tests/factories/fulfilment'
import { makeProduct, resetShop, setMinimums, SHOP_OF } from '@tests/factories/orders'

const relay = vi.hoisted(() => ({ refuse: 0, hold: null as Promise<void> | null }))

vi.mock('nodemailer', async (importOriginal) => {
  const real = (await importOriginal<{ default: typeof Nodemailer }>()).default
  const createTransport: typeof real.createTransport = (...args: Parameters<typeof real.createTransport>) => {
    const transport = real.createTransport(...args)
    const send = transport.sendMail.bind(transport) as (mail: unknown) => Promise<unknown>
    transport.sendMail = ((mail: unknown) => {
      if (relay.refuse > 0) {
        relay.refuse -= 1
        return Promise.reject(new Error('421 4.3.2 relay busy, try again later'))
      }
      return relay.hold ? relay.hold.then(() => send(mail)) : send(mail)
    }) as typeof transport.sendMail
    return transport
  }
  return { default: { ...real, createTransport } }
})

const app = createApp({ pruneSessions: false })
let owner: ApiClient
let buyer: ApiClient

type OutboxRow = {
  id: string
  job: { kind: string; mail?: { kind: string; orderId: number } }
  attempts: number
  last_error: string | null
  due_in_s: number
  gave_up: boolean
}

const outbox = () =>
  sequelize.query<OutboxRow>(
    `SELECT id, job, attempts, last_error, extract(epoch FROM next_attempt_at - now())::float AS due_in_s,
            gave_up_at IS NOT NULL AS gave_up
       FROM mail_outbox ORDER BY id`,
    { type: QueryTypes.SELECT },
  )

const mailsAbout = async (subject: string) =>
  (await allMail()).filter(
    (m) => m.subject === subject && m.to.some((t) => t.address === SHOP_OF.buyerA.buyer.email),
  ).length

/** Posts a buyer's order of `cases` cases of one product, whatever the answer. */
const postOrder = (productId: number, cases: number) =>
  buyer.post('/api/orders', { lines: [{ productId, cases }] }, { 'Idempotency-Key': randomUUID() })

async function placedOrder(): Promise<{ id: number; number: string }> {
  const p = await makeProduct({ batches: [{ readyInDays: -10, bars: 60 }] })
  const r = await postOrder(p.productId, 1)
  expect(r.status).toBe(201)
  await drainMail()
  return r.body.order
}

beforeAll(async () => {
  ;[owner, buyer] = await Promise.all([clientAs(app, 'owner'), clientAs(app, 'buyerA')])
})

beforeEach(async () => {
  relay.refuse = 0
  await drainMail()
  await sequelize.query('DELETE FROM mail_outbox')
  await setMinimums(0, 0)
  await updateSettings({ autoConfirmGoodStanding: false })
  await resetShop('buyerA')
})

describe('the mail outbox', () => {
  it('an order’s e-mails leave nothing behind once the relay has them; a refused order keeps none', async () => {
    const order = await placedOrder()
    await waitForMail(SHOP_OF.buyerA.buyer.email, new RegExp(`Order ${order.number} placed`))
    expect(await outbox()).toEqual([])
    // Refused (more cases than there are): the transaction rolled back, its e-mail with it.
    const p = await makeProduct({ batches: [{ readyInDays: -10, bars: 6 }] })
    const r = await postOrder(p.productId, 5)
    expect(r.status).toBe(409)
    await drainMail()
    expect(await outbox()).toEqual([])
  })

  it('keeps an e-mail the relay refused, with its error and a wait, and sends it when the wait is over', async () => {
    const order = await placedOrder()
    const subject = `Order ${order.number} confirmed`
    relay.refuse = 1
    expect((await owner.post(`/api/orders/${order.id}/confirm`)).status).toBe(200)
    await drainMail()
    const [kept, ...more] = await outbox()
    expect(more).toEqual([])
    expect(kept).toMatchObject({
      job: { kind: 'order', mail: { kind: 'confirmed', orderId: order.id } },
      attempts: 1,
      gave_up: false,
    })
    expect(kept!.last_error).toContain('relay busy')
    // The first wait is a minute.
    expect(kept!.due_in_s).toBeGreaterThan(50)
    expect(kept!.due_in_s).toBeLessThanOrEqual(60)
    expect(await mailsAbout(subject)).toBe(0)
    // Not due yet: the outbox job leaves it.
    expect(await sendDueMail()).toBe(0)
    await sequelize.query("UPDATE mail_outbox SET next_attempt_at = now() - interval '1 second'")
    expect(await sendDueMail()).toBe(1)
    await drainMail()
    await waitForMail(SHOP_OF.buyerA.buyer.email, new RegExp(subject))
    expect(await outbox()).toEqual([])
  })

  it('keeps a placed order’s e-mail, written by the placing statement itself, when the relay refuses it', async () => {
    const p = await makeProduct({ batches: [{ readyInDays: -10, bars: 60 }] })
    relay.refuse = 1
    const r = await postOrder(p.productId, 1)
    expect(r.status).toBe(201)
    await drainMail()
    const rows = await sequelize.query<{ job: unknown; label: string; attempts: number }>(
      'SELECT job, label, attempts FROM mail_outbox',
      { type: QueryTypes.SELECT },
    )
    expect(rows).toEqual([
      {
        job: { kind: 'order', mail: { kind: 'placed', orderId: r.body.order.id } },
        label: `order ${r.body.order.id} placed`,
        attempts: 1,
      },
    ])
    await sequelize.query("UPDATE mail_outbox SET next_attempt_at = now() - interval '1 second'")
    expect(await sendDueMail()).toBe(1)
    await drainMail()
    await waitForMail(SHOP_OF.buyerA.buyer.email, new RegExp(`Order ${r.body.order.number} placed`))
    expect(await outbox()).toEqual([])
  })

  it('sends, exactly once, an e-mail whose process ended before it went out', async () => {
    const order = await placedOrder()
    const subject = `Order ${order.number} confirmed`
    // As a change's transaction writes it: leased to its own process for LEASE_SECONDS.
    await sequelize.query(
      `INSERT INTO mail_outbox (job, label, next_attempt_at) VALUES ($1::jsonb, 'left over', now() + make_interval(secs => $2))`,
      {
        bind: [
          JSON.stringify({ kind: 'order', mail: { kind: 'confirmed', orderId: order.id } }),
          LEASE_SECONDS,
        ],
      },
    )
    expect(await sendDueMail()).toBe(0)
    // The lease ran out with nobody to send it (the process had stopped).
    await sequelize.query("UPDATE mail_outbox SET next_attempt_at = now() - interval '1 second'")
    // Two outbox runs at once (a slow tick and the next): one of them takes it.
    const started = await Promise.all([sendDueMail(), sendDueMail()])
    expect(started.sort()).toEqual([0, 1])
    await drainMail()
    await waitForMail(SHOP_OF.buyerA.buyer.email, new RegExp(subject))
    expect(await mailsAbout(subject)).toBe(1)
    expect(await outbox()).toEqual([])
  })

  it('gives up after the last try, says so in the log, and keeps the row for the record', async () => {
    const order = await placedOrder()
    await sequelize.query(
      `INSERT INTO mail_outbox (job, label, attempts, last_error, next_attempt_at)
       VALUES ($1::jsonb, 'failing', $2, 'relay busy', now() - interval '1 second')`,
      {
        bind: [
          JSON.stringify({ kind: 'order', mail: { kind: 'confirmed', orderId: order.id } }),
          MAX_ATTEMPTS - 1,
        ],
      },
    )
    relay.refuse = 1
    // An error in the log is expected here (the fail-on-console-error guard is stepped around).
    const errors = vi.spyOn(console, 'error').mockImplementation(() => {})
    try {
      expect(await sendDueMail()).toBe(1)
      await drainMail()
      expect(errors).toHaveBeenCalledWith(expect.stringContaining('mail given up'))
    } finally {
      errors.mockRestore()
    }
    const [row] = await outbox()
    expect(row).toMatchObject({ attempts: MAX_ATTEMPTS, gave_up: true })
    expect(await sendDueMail()).toBe(0)
  })

  it('keeps the invoice’s and the parcel’s e-mails of a shipment the relay refused, and sends both later', async () => {
    const soap = await makeSellable(owner, { bars: 60 })
    const o = await makeOrder({
      shop: 'A',
      lines: [{ productId: soap.productId, cases: 1 }],
      status: 'packed',
    })
    relay.refuse = 10
    const shipped = await owner.post(`/api/orders/${o.orderId}/ship`, {
      carrier: 'UPS',
      trackingNumber: 'LC-OUTBOX-1',
      shipDate: await studioToday(),
    })
    expect(shipped.status).toBe(200)
    await drainMail()
    expect((await outbox()).map((r) => [r.job.kind, r.attempts])).toEqual([
      ['invoice', 1],
      ['shipment', 1],
    ])
    relay.refuse = 0
    await sequelize.query("UPDATE mail_outbox SET next_attempt_at = now() - interval '1 second'")
    expect(await sendDueMail()).toBe(2)
    await drainMail()
    await waitForMail(o.buyerEmail, new RegExp(`Order ${o.number} has shipped: UPS LC-OUTBOX-1`))
    await waitForMail(o.buyerEmail, new RegExp(`Invoice ${shipped.body.invoice.number} from`))
    expect(await outbox()).toEqual([])
  })
})

describe('a password-reset e-mail', () => {
  it('is not waited for: the answer comes while the relay still holds the message, which then arrives', async () => {
    let release = () => {}
    relay.hold = new Promise<void>((resolve) => (release = resolve))
    try {
      const email = SHOP_OF.buyerA.buyer.email
      const resets = async () =>
        (await allMail()).filter(
          (m) => /^Reset your/.test(m.subject) && m.to.some((t) => t.address === email),
        ).length
      const before = await resets()
      const r = await buyer.post('/api/auth/password-reset', { email })
      expect(r.status).toBe(204)
      expect(await resets()).toBe(before)
      release()
      await expect.poll(resets, { timeout: 10_000 }).toBe(before + 1)
    } finally {
      relay.hold = null
      release()
    }
  })
})

describe('unsent e-mails, as the owner sees them', () => {
  /** An order whose confirmation the relay refused once; answers it with the outbox row's id. */
  async function refusedConfirmation() {
    const order = await placedOrder()
    relay.refuse = 1
    expect((await owner.post(`/api/orders/${order.id}/confirm`)).status).toBe(200)
    await drainMail()
    const [row] = await outbox()
    return { order, id: Number(row!.id) }
  }

  it('lists what the relay refused, in the owner’s words; nothing still on its first try', async () => {
    const { order, id } = await refusedConfirmation()
    await sequelize.query(
      `INSERT INTO mail_outbox (job, label, next_attempt_at) VALUES ($1::jsonb, 'in flight', now() + interval '2 minutes')`,
      { bind: [JSON.stringify({ kind: 'shipment', orderId: order.id })] },
    )
    const r = await owner.get('/api/unsent-mail')
    expect(r.status).toBe(200)
    expect(r.body.items).toEqual([
      {
        id,
        kind: 'order',
        about: `Order ${order.number} confirmed`,
        orderId: order.id,
        invoiceId: null,
        shopName: SHOP_OF.buyerA.tradingName,
        attempts: 1,
        lastError: expect.stringContaining('relay busy'),
        gaveUp: false,
        nextAttemptAt: expect.any(String),
        createdAt: expect.any(String),
      },
    ])
    expect(Date.parse(r.body.items[0].nextAttemptAt) - Date.now()).toBeGreaterThan(30_000)
    for (const who of [buyer, await clientAs(app, 'packer')])
      expect((await who.get('/api/unsent-mail')).status).toBe(403)
  })

  it('sends one again now: still refused, it counts the try and says why; taken, it leaves the outbox', async () => {
    const { order, id } = await refusedConfirmation()
    relay.refuse = 1
    const again = await owner.post(`/api/unsent-mail/${id}/send`)
    expect(again.status).toBe(200)
    expect(again.body).toMatchObject({ sent: false, item: { id, attempts: 2, gaveUp: false } })
    expect(again.body.item.lastError).toContain('relay busy')
    const sent = await owner.post(`/api/unsent-mail/${id}/send`)
    expect(sent.status).toBe(200)
    expect(sent.body).toEqual({ sent: true })
    await waitForMail(SHOP_OF.buyerA.buyer.email, new RegExp(`Order ${order.number} confirmed`))
    expect(await outbox()).toEqual([])
    expect((await owner.get('/api/unsent-mail')).body.items).toEqual([])
    expect((await owner.post(`/api/unsent-mail/${id}/send`)).status).toBe(404)
    const trail = await sequelize.query<{ action: string }>(
      `SELECT action FROM audit_events WHERE entity = 'mail_outbox' AND entity_id = $1 ORDER BY id`,
      { bind: [id], type: QueryTypes.SELECT },
    )
    expect(trail.map((t) => t.action)).toEqual(['mail.refused_again', 'mail.sent_again'])
  })

  it('sends a given-up e-mail when asked, and a refused one stays given up', async () => {
    const { order, id } = await refusedConfirmation()
    await sequelize.query('UPDATE mail_outbox SET attempts = $2, gave_up_at = now() WHERE id = $1', {
      bind: [id, MAX_ATTEMPTS],
    })
    const listed = (await owner.get('/api/unsent-mail')).body.items
    expect(listed).toMatchObject([{ id, gaveUp: true, nextAttemptAt: null, attempts: MAX_ATTEMPTS }])
    relay.refuse = 1
    const errors = vi.spyOn(console, 'error').mockImplementation(() => {})
    try {
      const refused = await owner.post(`/api/unsent-mail/${id}/send`)
      expect(refused.body).toMatchObject({ sent: false, item: { gaveUp: true, attempts: MAX_ATTEMPTS + 1 } })
    } finally {
      errors.mockRestore()
    }
    expect((await owner.post(`/api/unsent-mail/${id}/send`)).body).toEqual({ sent: true })
    await waitForMail(SHOP_OF.buyerA.buyer.email, new RegExp(`Order ${order.number} confirmed`))
  })

  it('dismisses one the owner saw to, and refuses bad or unknown ids with the field at fault', async () => {
    const { order, id } = await refusedConfirmation()
    const subject = `Order ${order.number} confirmed`
    expect((await owner.post(`/api/unsent-mail/${id}/dismiss`)).status).toBe(204)
    expect(await outbox()).toEqual([])
    expect((await owner.post(`/api/unsent-mail/${id}/dismiss`)).status).toBe(404)
    expect(await mailsAbout(subject)).toBe(0)
    const [trail] = await sequelize.query<{ action: string; data: { about: string } }>(
      `SELECT action, data FROM audit_events WHERE entity = 'mail_outbox' AND entity_id = $1`,
      { bind: [id], type: QueryTypes.SELECT },
    )
    expect(trail).toEqual({ action: 'mail.dismissed', data: { about: subject } })
    for (const bad of ['abc', '0x10', '0', '99999999999']) {
      const r = await owner.post(`/api/unsent-mail/${bad}/send`)
      expect(r.status, bad).toBe(400)
      expect(r.body.error.details).toEqual([{ field: 'params.id', message: 'Not an e-mail of the outbox.' }])
    }
    expect((await owner.post('/api/unsent-mail/2147483000/dismiss')).status).toBe(404)
  })
})
