/**
 * Ids for rows written together: each a UUID (the routes' id check accepts it), later rows'
 * ids sort after earlier ones (so a table's primary key index takes a batch as an append),
 * and two batches made in the same millisecond do not share ids.
 */
import * as v from 'valibot'
import { describe, expect, it } from 'vitest'
import { MAX_ORDERED_ID_SEQUENCE, orderedIds } from '../../../../server/db/ordered-ids'
import { IdParams } from '../../../../shared/schemas/common'

describe('orderedIds', () => {
  it('gives UUIDs of version 7 that sort in the order of their row numbers', () => {
    const idOf = orderedIds(Date.parse('2026-12-04T19:00:00Z'))
    const numbers = [0, 1, 2, 9, 10, 15, 16, 255, 256, 4095, 4096, 100_001, MAX_ORDERED_ID_SEQUENCE]
    const ids = numbers.map(idOf)
    expect(ids.every(id => v.is(IdParams.entries.id, id))).toBe(true)
    expect(ids.every(id => id[14] === '7' && '89ab'.includes(id[19]!))).toBe(true)
    expect([...ids].sort()).toEqual(ids)
    expect(new Set(ids).size).toBe(ids.length)
  })

  it('starts each id with the batch time, so later batches sort after earlier ones', () => {
    const ms = Date.parse('2026-12-04T19:00:00Z')
    expect(orderedIds(ms)(0).replace('-', '').slice(0, 12)).toBe(ms.toString(16).padStart(12, '0'))
    expect(orderedIds(ms + 1)(0) > orderedIds(ms)(MAX_ORDERED_ID_SEQUENCE)).toBe(true)
  })

  it('gives two batches of the same millisecond different ids', () => {
    const ms = Date.now()
    const a = orderedIds(ms)
    const b = orderedIds(ms)
    expect(a(2)).not.toBe(b(2))
  })

  it('refuses a row number it cannot carry', () => {
    const idOf = orderedIds(Date.now())
    expect(() => idOf(-1)).toThrow(RangeError)
    expect(() => idOf(MAX_ORDERED_ID_SEQUENCE + 1)).toThrow(RangeError)
    expect(() => idOf(1.5)).toThrow(RangeError)
  })
})
