/**
 * The pure parts of the local card-service fake: the Luhn check its card page applies, the form
 * decoding of the SDK's requests, and its webhook signature, which the SDK itself must accept.
 */
import Stripe from 'stripe'
import { describe, expect, it } from 'vitest'
import { luhnValid, parseForm, signPayload } from '../../scripts/lib/card-service-fake'

describe('luhnValid', () => {
  it.each([
    // ISO/IEC 7812-1 Annex B check digit (the Luhn formula); the worked example "79927398713"
    // is the one commonly used to show it (from memory).
    // The page asks for 12 to 19 digits, so it is padded with leading zeros, which leave the sum as it is.
    ['0079927398713', true, 'ISO/IEC 7812-1 Annex B, worked example 79927398713 (from memory)'],
    ['0079927398710', false, 'the same number with a wrong check digit'],
    ['79927398713', false, 'the worked example itself: valid by Luhn, but shorter than the page takes'],
    ['4242424242424242', true, "the card provider's published paying test number (from memory)"],
    ['4000000000000002', true, "the card provider's published declining test number (from memory)"],
    ['4242424242424241', false, 'one digit off'],
    ['42424242', false, 'too short for a card number (ISO/IEC 7812-1: 8 to 19 digits; the page asks 12+)'],
    ['4242 4242 4242 4242', false, 'spaces are removed by the page before the check'],
  ])('%s → %s (%s)', (digits, valid) => {
    expect(luhnValid(digits)).toBe(valid)
  })
})

describe('parseForm', () => {
  it('decodes the bracketed keys the SDK sends', () => {
    const body =
      'mode=payment&line_items[0][quantity]=1&line_items[0][price_data][currency]=usd&line_items[0][price_data][unit_amount]=1234' +
      '&line_items[0][price_data][product_data][name]=Invoice%20LC-2026-000001&success_url=http%3A%2F%2Fa%2Fok%3Fs%3D%7BCHECKOUT_SESSION_ID%7D' +
      '&metadata[invoiceId]=5&enabled_events[0]=checkout.session.completed'
    expect(parseForm(body)).toEqual({
      mode: 'payment',
      line_items: {
        '0': {
          quantity: '1',
          price_data: {
            currency: 'usd',
            unit_amount: '1234',
            product_data: { name: 'Invoice LC-2026-000001' },
          },
        },
      },
      success_url: 'http://a/ok?s={CHECKOUT_SESSION_ID}',
      metadata: { invoiceId: '5' },
      enabled_events: { '0': 'checkout.session.completed' },
    })
  })
})

describe('signPayload', () => {
  const stripe = new Stripe('sk_test_unit_only')
  const payload = JSON.stringify({ id: 'evt_test_1', object: 'event', type: 'checkout.session.completed' })

  it('is accepted by the SDK with the same secret, and refused with another or a changed body', () => {
    const header = signPayload(payload, 'whsec_unit_secret')
    expect(stripe.webhooks.constructEvent(payload, header, 'whsec_unit_secret').id).toBe('evt_test_1')
    expect(() => stripe.webhooks.constructEvent(payload, header, 'whsec_other')).toThrow()
    expect(() =>
      stripe.webhooks.constructEvent(
        payload.replace('evt_test_1', 'evt_test_2'),
        header,
        'whsec_unit_secret',
      ),
    ).toThrow()
  })

  it('matches the SDK’s own test signature for the same timestamp', () => {
    const timestamp = 1_796_000_000
    const ours = signPayload(payload, 'whsec_unit_secret', timestamp)
    const theirs = stripe.webhooks.generateTestHeaderString({
      payload,
      secret: 'whsec_unit_secret',
      timestamp,
    })
    expect(ours).toBe(theirs)
  })

  it('is refused by the SDK once older than its tolerance (300 s by default)', () => {
    const header = signPayload(payload, 'whsec_unit_secret', Math.floor(Date.now() / 1000) - 3600)
    expect(() => stripe.webhooks.constructEvent(payload, header, 'whsec_unit_secret')).toThrow(/tolerance/i)
  })
})
