/**
 * A NUL character (U+0000) in any text: PostgreSQL's text and jsonb cannot store one, so before
 * validate() refused it the query failed and the request answered 500 (found by the hostile
 * bodies on POST /api/products/:id/declaration). Each request below is otherwise good: it is the
 * NUL alone that is refused, with 400 on its field, and nothing is written.
 */
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '@server/app'
import { sequelize } from '@server/db/sequelize'
import { ApiClient, clientAs } from '@tests/factories/api-client'
import { apply, applicantFields } from '@tests/factories/applications'
import { makeSellable } from '@tests/factories/fulfilment'
import { resetShop, setMinimums } from '@tests/factories/orders'
import { dbSnapshot } from './db-state'

const app = createApp({ pruneSessions: false, applicationLimits: { perHour: 100, attemptsPerHour: 100 } })

let owner: ApiClient
let buyer: ApiClient
let productId = 0

beforeAll(async () => {
  await setMinimums(0, 0)
  await resetShop('buyerA')
  ;[owner, buyer] = await Promise.all([clientAs(app, 'owner'), clientAs(app, 'buyerA')])
  productId = (await makeSellable(owner, { bars: 60 })).productId
})

const fieldsOf = (r: { body: { error?: { details?: { field: string }[] } } }) =>
  (r.body.error?.details ?? []).map((d) => d.field)

describe('a NUL character in text', () => {
  it.each([
    [
      'the declaration text',
      () => owner.post(`/api/products/${productId}/declaration`, { text: 'Sodium olivate\u0000, water' }),
      'text',
    ],
    [
      'an order note',
      () =>
        buyer.post(
          '/api/orders',
          { lines: [{ productId, cases: 1 }], poNumber: 'PO-NUL', note: 'Leave it at the\u0000 back door' },
          { 'Idempotency-Key': randomUUID() },
        ),
      'note',
    ],
    [
      'a nested line field',
      () =>
        buyer.post(
          '/api/orders',
          { lines: [{ productId, cases: '1\u0000' }] },
          { 'Idempotency-Key': randomUUID() },
        ),
      'lines.0.cases',
    ],
    [
      'an ingredient name',
      () => owner.post('/api/ingredients', { name: 'Olive\u0000 oil', kind: 'oil', sapNaoh: 0.135 }),
      'name',
    ],
    ['a search', () => owner.get('/api/orders?q=PO%00'), 'query.q'],
    // Half of a UTF-16 pair (found by the hostile bodies: the audit row's json refused it, 500).
    [
      'a lone surrogate in the declaration text',
      () => owner.post(`/api/products/${productId}/declaration`, { text: 'Sodium olivate \ud800, water' }),
      'text',
    ],
    [
      'a lone low surrogate in an order note',
      () =>
        buyer.post(
          '/api/orders',
          { lines: [{ productId, cases: 1 }], poNumber: 'PO-SUR', note: 'Back \udc00door' },
          { 'Idempotency-Key': randomUUID() },
        ),
      'note',
    ],
  ])('%s is refused with 400 on its field and nothing is written', async (_what, send, field) => {
    const before = await dbSnapshot(sequelize)
    const r = await send()
    expect(r.status, JSON.stringify(r.body)).toBe(400)
    expect(r.body.error.code).toBe('invalid_input')
    expect(fieldsOf(r)).toContain(field)
    expect(await dbSnapshot(sequelize)).toEqual(before)
  })

  it('in a field of the public application form (multipart) is refused on that field', async () => {
    const visitor = new ApiClient(app)
    await visitor.token()
    const before = await dbSnapshot(sequelize)
    const r = await apply(visitor, applicantFields({ tradingName: 'Nul\u0000 & Co' }))
    expect(r.status, JSON.stringify(r.body)).toBe(400)
    expect(fieldsOf(r)).toContain('tradingName')
    expect(await dbSnapshot(sequelize)).toEqual(before)
  })

  it('the same requests without it are accepted', async () => {
    const r = await owner.post(`/api/products/${productId}/declaration`, { text: 'Sodium olivate, water' })
    expect(r.status, JSON.stringify(r.body)).toBeLessThan(300)
    const o = await buyer.post(
      '/api/orders',
      { lines: [{ productId, cases: 1 }], poNumber: 'PO-NUL', note: 'Leave it at the back door' },
      { 'Idempotency-Key': randomUUID() },
    )
    expect(o.status, JSON.stringify(o.body)).toBe(201)
  })
})
