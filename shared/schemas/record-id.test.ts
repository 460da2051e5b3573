import { describe, expect, it } from 'vitest'
import { MAX_RECORD_ID, recordId } from './record-id'

const schema = recordId('Not an order number.')

describe('recordId', () => {
  // The accepted form is the decimal literal of a positive PostgreSQL integer (PostgreSQL
  // documentation, "Numeric Types": integer is -2147483648 to +2147483647).
  it.each([
    ['1', 1],
    ['16', 16],
    ['2147483647', MAX_RECORD_ID],
    [42, 42],
  ])('reads %j as %d', (raw, id) => {
    expect(schema.parse(raw)).toBe(id)
  })

  it.each([
    '0x10',
    '1e3',
    '16.0',
    '+16',
    ' 16',
    '16 ',
    '016',
    '0',
    '-1',
    '',
    '2147483648',
    '99999999999',
    '١٦',
    0,
    1.5,
    MAX_RECORD_ID + 1,
    null,
  ])('refuses %j with the schema’s own words', (raw) => {
    const r = schema.safeParse(raw)
    expect(r.success).toBe(false)
    expect(r.error?.issues[0]?.message).toBe('Not an order number.')
  })
})
