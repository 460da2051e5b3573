/**
 * A local stand-in for the hosted card-payment service, on loopback, so that nothing leaves the
 * machine in development and tests. It answers the few API calls the SDK makes here (checkout
 * sessions, refunds, webhook endpoints, events), serves a small hosted checkout page where a test
 * card number pays or is declined, and calls the app back with webhook events signed the way the
 * real service signs them (HMAC-SHA256 of `${timestamp}.${payload}` under the endpoint's secret,
 * sent as `Stripe-Signature: t=…,v1=…`). State lives in memory and is gone when it stops.
 */
import { createHmac, randomBytes } from 'node:crypto'
import http from 'node:http'
import type { AddressInfo } from 'node:net'

export type CardServiceFakeOptions = {
  port?: number
  host?: string
  /** Signs every webhook delivery; the app's CARD_WEBHOOK_SECRET. */
  webhookSecret: string
  /** Where events go for any key that registered no endpoint of its own (`npm start` sets the app's). */
  webhookUrl?: string
  log?: (line: string) => void
}

export type CardServiceFake = { url: string; port: number; stop(): Promise<void> }

/** Card numbers the checkout page treats specially; any other valid number pays. */
export const TEST_CARDS = {
  pays: '4242424242424242',
  declined: '4000000000000002',
  insufficientFunds: '4000000000009995',
} as const

type Session = {
  id: string
  object: 'checkout.session'
  key: string
  mode: 'payment'
  status: 'open' | 'complete' | 'expired'
  payment_status: 'unpaid' | 'paid'
  amount_total: number
  amount_subtotal: number
  currency: string
  client_reference_id: string | null
  metadata: Record<string, string>
  success_url: string
  cancel_url: string
  payment_intent: string | null
  url: string
  created: number
  expires_at: number
  livemode: false
  description: string
  declines: number
}

type PaymentIntent = { id: string; key: string; amount: number; currency: string; refunded: number }

type FakeEvent = {
  id: string
  object: 'event'
  type: string
  created: number
  api_version: string
  livemode: false
  pending_webhooks: number
  data: { object: Record<string, unknown> }
  key: string
  deliveries: { at: string; url: string; status: number | null }[]
}

const id = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`
const now = () => Math.floor(Date.now() / 1000)

/** `a[b][0][c]=x` form bodies, as the SDK encodes them, into nested objects. */
export function parseForm(body: string): Record<string, unknown> {
  const out: Record<string, unknown> = {}
  for (const pair of body.split('&')) {
    if (!pair) continue
    const eq = pair.indexOf('=')
    const rawKey = decodeURIComponent((eq < 0 ? pair : pair.slice(0, eq)).replace(/\+/g, ' '))
    const value = eq < 0 ? '' : decodeURIComponent(pair.slice(eq + 1).replace(/\+/g, ' '))
    const parts = rawKey.split(/\[|\]\[|\]/).filter((p, i) => p !== '' || i === 0)
    let node: Record<string, unknown> = out
    parts.forEach((part, i) => {
      if (i === parts.length - 1) node[part] = value
      else node = (node[part] ??= {}) as Record<string, unknown>
    })
  }
  return out
}

const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)

export function luhnValid(digits: string): boolean {
  if (!/^\d{12,19}$/.test(digits)) return false
  let sum = 0
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i])
    if (i % 2 === 1) {
      d *= 2
      if (d > 9) d -= 9
    }
    sum += d
  }
  return sum % 10 === 0
}

export function signPayload(payload: string, secret: string, timestamp = now()): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex')
  return `t=${timestamp},v1=${v1}`
}

function money(cents: number, currency: string) {
  try {
    return new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase() }).format(
      cents / 100,
    )
  } catch {
    return `${(cents / 100).toFixed(2)} ${currency.toUpperCase()}`
  }
}

const PAGE_CSS = `
  *{box-sizing:border-box}body{margin:0;font:16px/1.5 system-ui,sans-serif;background:#efeae2;color:#29251f}
  main{max-width:30rem;margin:3rem auto;padding:0 1rem}
  .card{background:#fff;border:1px solid #d9d1c4;border-radius:10px;padding:1.5rem 1.75rem}
  h1{font-size:1.3rem;margin:0 0 .25rem}.amount{font-size:2rem;font-weight:600;margin:.25rem 0 1rem}
  .note{background:#f6f1e7;border-left:4px solid #8a6d3b;padding:.6rem .8rem;font-size:.9rem;margin:0 0 1.25rem}
  label{display:block;font-weight:500;margin:.9rem 0 .25rem}input{width:100%;font:inherit;padding:.55rem .65rem;
  border:1px solid #a79e90;border-radius:6px}.row{display:grid;grid-template-columns:1fr 1fr;gap:1rem}
  button{margin-top:1.4rem;width:100%;font:inherit;font-weight:600;padding:.7rem;border:0;border-radius:6px;
  background:#2f4a6b;color:#fff;cursor:pointer}a{color:#2f4a6b}
  .error{background:#fbeae6;border:1px solid #b5452f;color:#7a2413;padding:.6rem .8rem;border-radius:6px;margin:0 0 1rem}
  .fine{font-size:.85rem;color:#5d564c;margin-top:1rem}`

function checkoutPage(s: Session, opts: { error?: string; values?: Record<string, string> } = {}) {
  const v = opts.values ?? {}
  const field = (name: string, label: string, attrs: string) =>
    `<label for="${name}">${label}</label><input id="${name}" name="${name}" ${attrs} value="${escape(v[name] ?? '')}">`
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>Card payment: ${escape(s.description)}</title><style>${PAGE_CSS}</style></head><body><main>
<div class="card">
<h1>Pay by card</h1>
<p>${escape(s.description)}${s.client_reference_id && !s.description.includes(s.client_reference_id) ? ` · reference ${escape(s.client_reference_id)}` : ''}</p>
<p class="amount">${escape(money(s.amount_total, s.currency))}</p>
<p class="note">Test card page running on this machine: no card is charged. ${TEST_CARDS.pays.replace(/(\d{4})(?=\d)/g, '$1 ')} pays;
${TEST_CARDS.declined.replace(/(\d{4})(?=\d)/g, '$1 ')} is declined. Any future expiry date and any 3 digits.</p>
${opts.error ? `<p class="error" role="alert">${escape(opts.error)}</p>` : ''}
<form method="post" action="/checkout/${escape(s.id)}" novalidate>
${field('name', 'Name on card', 'autocomplete="cc-name" required')}
${field('number', 'Card number', 'inputmode="numeric" autocomplete="cc-number" required')}
<div class="row"><div>${field('expiry', 'Expiry (MM/YY)', 'autocomplete="cc-exp" placeholder="MM/YY" required')}</div>
<div>${field('cvc', 'Security code', 'inputmode="numeric" autocomplete="cc-csc" required')}</div></div>
<button type="submit">Pay ${escape(money(s.amount_total, s.currency))}</button>
</form>
<p class="fine"><a href="${escape(s.cancel_url.replace('{CHECKOUT_SESSION_ID}', s.id))}">Cancel and go back</a></p>
</div></main></body></html>`
}

function donePage(title: string, text: string) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escape(title)}</title><style>${PAGE_CSS}</style></head>
<body><main><div class="card"><h1>${escape(title)}</h1><p>${escape(text)}</p></div></main></body></html>`
}

function expiryError(expiry: string): string | null {
  const m = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(expiry)
  if (!m) return 'Enter the expiry date as MM/YY.'
  const month = Number(m[1])
  const year = m[2]!.length === 2 ? 2000 + Number(m[2]) : Number(m[2])
  if (month < 1 || month > 12) return 'The expiry month must be 01 to 12.'
  const d = new Date()
  if (year < d.getUTCFullYear() || (year === d.getUTCFullYear() && month < d.getUTCMonth() + 1)) {
    return 'This card has expired.'
  }
  return null
}

export async function startCardServiceFake(opts: CardServiceFakeOptions): Promise<CardServiceFake> {
  const log = opts.log ?? (() => {})
  const host = opts.host ?? '127.0.0.1'
  const sessions = new Map<string, Session>()
  const intents = new Map<string, PaymentIntent>()
  const events: FakeEvent[] = []
  const endpoints = new Map<string, { id: string; url: string; enabled_events: string[] }[]>()
  const idempotent = new Map<string, { status: number; body: unknown }>()
  let base = ''

  const json = (res: http.ServerResponse, status: number, body: unknown) => {
    res.writeHead(status, { 'content-type': 'application/json', 'request-id': id('req') })
    res.end(JSON.stringify(body))
  }
  const apiError = (
    res: http.ServerResponse,
    status: number,
    message: string,
    extra: Record<string, string> = {},
  ) => json(res, status, { error: { type: 'invalid_request_error', message, ...extra } })
  const html = (res: http.ServerResponse, status: number, body: string, formTo: string[] = []) => {
    res.writeHead(status, {
      'content-type': 'text/html; charset=utf-8',
      'cache-control': 'no-store',
      'content-security-policy': `default-src 'none'; style-src 'unsafe-inline'; form-action 'self' ${formTo.join(' ')}; frame-ancestors 'none'`,
    })
    res.end(body)
  }

  const publicSession = (s: Session) => {
    const { key: _key, declines: _declines, description: _d, ...rest } = s
    return rest
  }

  async function deliver(event: FakeEvent, attempt = 1): Promise<void> {
    const urls = (endpoints.get(event.key) ?? [])
      .filter((e) => e.enabled_events.includes('*') || e.enabled_events.includes(event.type))
      .map((e) => e.url)
    if (urls.length === 0 && opts.webhookUrl) urls.push(opts.webhookUrl)
    const { key: _key, deliveries: _d, ...wire } = event
    const payload = JSON.stringify(wire, null, 2)
    const failed: string[] = []
    for (const url of urls) {
      let status: number | null = null
      try {
        const r = await fetch(url, {
          method: 'POST',
          headers: {
            'content-type': 'application/json; charset=utf-8',
            'stripe-signature': signPayload(payload, opts.webhookSecret),
            'user-agent': 'card-service-fake/1',
          },
          body: payload,
          signal: AbortSignal.timeout(10_000),
        })
        status = r.status
        await r.arrayBuffer()
      } catch {
        status = null
      }
      event.deliveries.push({ at: new Date().toISOString(), url, status })
      log(`webhook ${event.type} ${event.id} → ${url}: ${status ?? 'no answer'}`)
      if (status === null || status >= 300) failed.push(url)
    }
    // Retries with back-off, as the real service does (much shorter here).
    if (failed.length && attempt < 5) {
      setTimeout(() => void deliver(event, attempt + 1), 500 * 2 ** (attempt - 1)).unref()
    }
  }

  function emit(key: string, type: string, object: Record<string, unknown>): FakeEvent {
    const event: FakeEvent = {
      id: id('evt'),
      object: 'event',
      type,
      created: now(),
      api_version: '2026-10-28.endive',
      livemode: false,
      pending_webhooks: 1,
      data: { object },
      key,
      deliveries: [],
    }
    events.push(event)
    return event
  }

  async function api(req: http.IncomingMessage, res: http.ServerResponse, url: URL, body: string) {
    const auth = req.headers.authorization ?? ''
    const key = auth.startsWith('Bearer ') ? auth.slice(7) : ''
    if (!key.startsWith('sk_test_')) {
      return apiError(res, 401, 'Invalid API Key provided: this test service takes sk_test_ keys only.')
    }
    const idemKey = req.method === 'POST' ? req.headers['idempotency-key'] : undefined
    const cacheKey = typeof idemKey === 'string' ? `${key} ${url.pathname} ${idemKey}` : null
    if (cacheKey && idempotent.has(cacheKey)) {
      const hit = idempotent.get(cacheKey)!
      return json(res, hit.status, hit.body)
    }
    const reply = (status: number, payload: unknown) => {
      if (cacheKey && status < 500) idempotent.set(cacheKey, { status, body: payload })
      json(res, status, payload)
    }
    const form = parseForm(body)
    const path = url.pathname

    if (req.method === 'POST' && path === '/v1/checkout/sessions') {
      const items = Object.values((form.line_items ?? {}) as Record<string, Record<string, unknown>>)
      if (form.mode !== 'payment')
        return reply(400, {
          error: {
            type: 'invalid_request_error',
            param: 'mode',
            message: 'Only mode=payment is supported here.',
          },
        })
      if (items.length === 0)
        return reply(400, {
          error: { type: 'invalid_request_error', param: 'line_items', message: 'line_items is required.' },
        })
      let total = 0
      let currency = ''
      let description = ''
      for (const item of items) {
        const pd = (item.price_data ?? {}) as Record<string, unknown>
        const unit = Number(pd.unit_amount)
        const qty = Number(item.quantity ?? 1)
        if (!Number.isSafeInteger(unit) || unit <= 0 || !Number.isSafeInteger(qty) || qty <= 0) {
          return reply(400, {
            error: {
              type: 'invalid_request_error',
              param: 'line_items',
              message: 'Each line needs a whole unit_amount and quantity above zero.',
            },
          })
        }
        if (typeof pd.currency !== 'string' || !/^[a-z]{3}$/.test(pd.currency)) {
          return reply(400, {
            error: {
              type: 'invalid_request_error',
              param: 'currency',
              message: 'currency must be a lowercase ISO code.',
            },
          })
        }
        if (currency && currency !== pd.currency) {
          return reply(400, {
            error: {
              type: 'invalid_request_error',
              param: 'currency',
              message: 'All lines must share one currency.',
            },
          })
        }
        currency = pd.currency
        total += unit * qty
        description ||= String(((pd.product_data ?? {}) as Record<string, unknown>).name ?? 'Payment')
      }
      for (const p of ['success_url', 'cancel_url'] as const) {
        if (typeof form[p] !== 'string' || !/^https?:\/\//.test(form[p] as string)) {
          return reply(400, {
            error: { type: 'invalid_request_error', param: p, message: `${p} must be an http(s) URL.` },
          })
        }
      }
      const s: Session = {
        id: id('cs'),
        object: 'checkout.session',
        key,
        mode: 'payment',
        status: 'open',
        payment_status: 'unpaid',
        amount_total: total,
        amount_subtotal: total,
        currency,
        client_reference_id: typeof form.client_reference_id === 'string' ? form.client_reference_id : null,
        metadata: (form.metadata ?? {}) as Record<string, string>,
        success_url: form.success_url as string,
        cancel_url: form.cancel_url as string,
        payment_intent: null,
        url: '',
        created: now(),
        expires_at: now() + 24 * 3600,
        livemode: false,
        description,
        declines: 0,
      }
      s.url = `${base}/checkout/${s.id}`
      sessions.set(s.id, s)
      log(`checkout ${s.id} for ${money(total, currency)} (${s.client_reference_id ?? 'no reference'})`)
      return reply(200, publicSession(s))
    }

    const sessionMatch = /^\/v1\/checkout\/sessions\/([A-Za-z0-9_]+)$/.exec(path)
    if (req.method === 'GET' && sessionMatch) {
      const s = sessions.get(sessionMatch[1]!)
      if (!s || s.key !== key)
        return apiError(res, 404, `No such checkout.session: '${sessionMatch[1]}'`, {
          code: 'resource_missing',
        })
      return reply(200, publicSession(s))
    }

    if (req.method === 'POST' && path === '/v1/refunds') {
      const pi = intents.get(String(form.payment_intent ?? ''))
      if (!pi || pi.key !== key) {
        return reply(404, {
          error: {
            type: 'invalid_request_error',
            code: 'resource_missing',
            param: 'payment_intent',
            message: `No such payment_intent: '${String(form.payment_intent ?? '')}'`,
          },
        })
      }
      const left = pi.amount - pi.refunded
      const amount = form.amount === undefined ? left : Number(form.amount)
      if (!Number.isSafeInteger(amount) || amount <= 0) {
        return reply(400, {
          error: {
            type: 'invalid_request_error',
            param: 'amount',
            message: 'amount must be a whole number above zero.',
          },
        })
      }
      if (amount > left) {
        return reply(400, {
          error: {
            type: 'invalid_request_error',
            code: 'amount_too_large',
            param: 'amount',
            message: `Refund amount (${amount}) is greater than the unrefunded amount (${left}).`,
          },
        })
      }
      pi.refunded += amount
      const refund = {
        id: id('re'),
        object: 'refund',
        amount,
        currency: pi.currency,
        payment_intent: pi.id,
        status: 'succeeded',
        created: now(),
        metadata: (form.metadata ?? {}) as Record<string, string>,
      }
      emit(key, 'refund.created', refund)
      log(`refund ${refund.id} of ${money(amount, pi.currency)} on ${pi.id}`)
      return reply(200, refund)
    }

    if (req.method === 'POST' && path === '/v1/webhook_endpoints') {
      if (typeof form.url !== 'string' || !/^https?:\/\//.test(form.url)) {
        return reply(400, {
          error: { type: 'invalid_request_error', param: 'url', message: 'url must be an http(s) URL.' },
        })
      }
      const enabled = Object.values((form.enabled_events ?? {}) as Record<string, string>)
      const ep = { id: id('we'), url: form.url, enabled_events: enabled.length ? enabled : ['*'] }
      endpoints.set(key, [...(endpoints.get(key) ?? []), ep])
      return reply(200, {
        ...ep,
        object: 'webhook_endpoint',
        status: 'enabled',
        secret: opts.webhookSecret,
        livemode: false,
      })
    }

    if (req.method === 'GET' && path === '/v1/events') {
      const type = url.searchParams.get('type')
      const data = events
        .filter((e) => e.key === key && (!type || e.type === type))
        .reverse()
        .map(({ key: _k, deliveries: _d, ...e }) => e)
      return reply(200, { object: 'list', url: '/v1/events', has_more: false, data })
    }

    return apiError(res, 404, `Unrecognized request URL (${req.method}: ${path}).`)
  }

  async function checkout(
    req: http.IncomingMessage,
    res: http.ServerResponse,
    sessionId: string,
    body: string,
  ) {
    const s = sessions.get(sessionId)
    if (!s)
      return html(res, 404, donePage('No such payment', 'This payment page does not exist or has expired.'))
    const returnTo = [new URL(s.success_url).origin, new URL(s.cancel_url).origin]
    if (s.status !== 'open') {
      return html(
        res,
        409,
        donePage(
          'Already paid',
          'This payment page has been used. You can close it and go back to the shop.',
        ),
      )
    }
    if (req.method === 'GET') return html(res, 200, checkoutPage(s), returnTo)

    const form = parseForm(body) as Record<string, string>
    const values = {
      name: form.name ?? '',
      number: form.number ?? '',
      expiry: form.expiry ?? '',
      cvc: form.cvc ?? '',
    }
    const digits = values.number.replace(/[\s-]/g, '')
    const again = (status: number, error: string) =>
      html(res, status, checkoutPage(s, { error, values: { ...values, cvc: '' } }), returnTo)
    if (!values.name.trim()) return again(400, 'Enter the name on the card.')
    if (!luhnValid(digits)) return again(400, 'That card number is not valid: check the digits.')
    const exp = expiryError(values.expiry)
    if (exp) return again(400, exp)
    if (!/^\d{3,4}$/.test(values.cvc.trim())) return again(400, 'Enter the 3 or 4 digit security code.')
    if (digits === TEST_CARDS.declined || digits === TEST_CARDS.insufficientFunds) {
      s.declines += 1
      log(`checkout ${s.id}: card declined`)
      return again(
        402,
        digits === TEST_CARDS.declined
          ? 'Your card was declined. Try another card, or go back and pay another way.'
          : 'Your card was declined for insufficient funds. Try another card, or go back and pay another way.',
      )
    }
    const pi: PaymentIntent = {
      id: id('pi'),
      key: s.key,
      amount: s.amount_total,
      currency: s.currency,
      refunded: 0,
    }
    intents.set(pi.id, pi)
    s.status = 'complete'
    s.payment_status = 'paid'
    s.payment_intent = pi.id
    const event = emit(s.key, 'checkout.session.completed', publicSession(s))
    // The first delivery is awaited so the shop's return page usually finds the payment recorded;
    // the return page still waits for it in case it is late.
    await deliver(event)
    res.writeHead(303, {
      location: s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id),
      'cache-control': 'no-store',
    })
    res.end()
  }

  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = []
    let size = 0
    req.on('data', (c: Buffer) => {
      size += c.length
      if (size <= 1_000_000) chunks.push(c)
    })
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8')
      const url = new URL(req.url ?? '/', 'http://fake')
      const run = async () => {
        if (url.pathname.startsWith('/v1/')) return api(req, res, url, body)
        const page = /^\/checkout\/([A-Za-z0-9_]+)$/.exec(url.pathname)
        if (page && (req.method === 'GET' || req.method === 'POST')) return checkout(req, res, page[1]!, body)
        // Not part of the real service: lets a test deliver an event again, as a retry would.
        const redeliver = /^\/fake\/events\/([A-Za-z0-9_]+)\/redeliver$/.exec(url.pathname)
        if (redeliver && req.method === 'POST') {
          const ev = events.find((e) => e.id === redeliver[1])
          if (!ev) return json(res, 404, { error: { message: 'No such event' } })
          const before = ev.deliveries.length
          await deliver(ev, 5)
          return json(res, 200, { id: ev.id, deliveries: ev.deliveries.slice(before) })
        }
        if (url.pathname === '/health') return json(res, 200, { ok: true })
        return json(res, 404, { error: { message: 'Not found' } })
      }
      run().catch((err: unknown) => {
        log(`error: ${(err as Error).message}`)
        if (!res.headersSent)
          json(res, 500, { error: { type: 'api_error', message: 'The test card service failed.' } })
      })
    })
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port ?? 0, host, () => resolve())
  })
  const port = (server.address() as AddressInfo).port
  base = `http://${host}:${port}`
  return {
    url: base,
    port,
    stop: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections()
        server.close(() => resolve())
      }),
  }
}
