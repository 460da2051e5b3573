import { describe, expect, it, vi } from 'vitest'

// The module parses process.env once at import; give it a database address to read.
vi.hoisted(() => {
  process.env.DATABASE_URL ??= 'postgres://u:p@127.0.0.1:5432/db'
})
const { parseEnv } = await import('@server/config/env')

const base = { DATABASE_URL: 'postgres://u:p@127.0.0.1:5432/db' }

describe('parseEnv: card payments', () => {
  it('leaves card payments off without a key', () => {
    const env = parseEnv(base)
    expect(env.CARD_SECRET_KEY).toBeUndefined()
    expect(env.CARD_API_HOST).toBeUndefined()
  })

  it('takes a test key, its webhook secret and the local service address', () => {
    const env = parseEnv({
      ...base,
      CARD_SECRET_KEY: 'sk_test_local_12345',
      CARD_WEBHOOK_SECRET: 'whsec_local_12345',
      CARD_API_HOST: '127.0.0.1',
      CARD_API_PORT: '12111',
      CARD_API_PROTOCOL: 'http',
    })
    expect(env).toMatchObject({ CARD_API_PORT: 12111, CARD_API_PROTOCOL: 'http' })
  })

  it.each([
    [{ CARD_SECRET_KEY: 'sk_test_local_12345' }, 'CARD_WEBHOOK_SECRET: is required with CARD_SECRET_KEY'],
    [
      {
        CARD_SECRET_KEY: 'sk_live_real_12345',
        CARD_WEBHOOK_SECRET: 'whsec_real_12345',
        CARD_API_PROTOCOL: 'http',
      },
      'CARD_API_PROTOCOL: a live key is never sent over plain http',
    ],
    [{ CARD_API_PROTOCOL: 'ftp' }, 'CARD_API_PROTOCOL'],
    [{ CARD_API_PORT: '70000' }, 'CARD_API_PORT'],
  ])('refuses %o, naming the setting', (extra, message) => {
    expect(() => parseEnv({ ...base, ...extra })).toThrow(message)
  })
})
