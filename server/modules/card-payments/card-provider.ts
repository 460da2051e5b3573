import type Stripe from 'stripe'
import { env } from '@server/config/env'
import { AppError } from '@server/lib/app-error'

// The hosted card-payment service, reached only through its official SDK. Where it lives comes
// from configuration: CARD_API_HOST / CARD_API_PORT / CARD_API_PROTOCOL point the SDK at the local
// fake in development and tests; unset, the SDK talks to the real service with a real key.

let client: Stripe | null = null

export function cardPaymentsEnabled(): boolean {
  return Boolean(env.CARD_SECRET_KEY && env.CARD_WEBHOOK_SECRET)
}

/**
 * 503 `card_payments_off` when no key is configured. The SDK is loaded at the first card call, not
 * at start: most requests never need it and it holds memory for the life of the process.
 */
export async function cardProvider(): Promise<Stripe> {
  if (!cardPaymentsEnabled()) {
    throw new AppError(
      503,
      'card_payments_off',
      'Card payments are not set up for this studio: pay by bank transfer or cheque, or ask the studio.',
    )
  }
  if (client) return client
  const { default: StripeSdk } = await import('stripe')
  client ??= new StripeSdk(env.CARD_SECRET_KEY!, {
    ...(env.CARD_API_HOST ? { host: env.CARD_API_HOST } : {}),
    ...(env.CARD_API_PORT ? { port: env.CARD_API_PORT } : {}),
    ...(env.CARD_API_PROTOCOL ? { protocol: env.CARD_API_PROTOCOL } : {}),
    maxNetworkRetries: 1,
    timeout: 20_000,
    appInfo: { name: 'Lathercase' },
  })
  return client
}

export async function webhookSecret(): Promise<string> {
  await cardProvider()
  return env.CARD_WEBHOOK_SECRET!
}

/** A failed call to the service answers 502 with what it said, never a bare 500. */
export function providerError(err: unknown, doing: string): AppError {
  const message = err instanceof Error ? err.message : String(err)
  return new AppError(502, 'card_provider_error', `The card service did not ${doing}: ${message}`)
}
