/**
 * Every schema that takes a date or a time reads it by one rule (shared/readings/fields.ts
 * parseIsoTime, the CSV import's): a day that does not exist, 24:00 and a guessable
 * 03/04/2026 are refused on every path, never rolled over or guessed.
 */
import * as v from 'valibot'
import { describe, expect, it } from 'vitest'
import { MAX_LIVESTOCK_COUNT } from '../../../../shared/readings/events'
import { AuditQuerySchema } from '../../../../shared/schemas/audit'
import { STAGE_DATA_SCHEMAS } from '../../../../shared/schemas/plan'
import { EventInputSchema, ReadingListQuerySchema, ReadingPatchSchema } from '../../../../shared/schemas/reading'
import { StartStockingSchema } from '../../../../shared/schemas/sign-off'

const LOOSE = ['2026-02-30T10:00:00Z', '2026-03-04T24:00:00Z', '+002026-02-30T10:00:00Z', '03/04/2026 09:00']
const ok = (schema: v.GenericSchema, input: unknown) => v.safeParse(schema, input).success

describe('times in input schemas', () => {
  it('refuses loose times for readings, events and list ranges; takes ISO 8601', () => {
    for (const time of LOOSE) {
      expect(ok(ReadingPatchSchema, { takenAt: time }), time).toBe(false)
      expect(ok(EventInputSchema, { at: time, kind: 'note', notes: 'x' }), time).toBe(false)
      expect(ok(ReadingListQuerySchema, { from: time }), time).toBe(false)
    }
    expect(ok(ReadingPatchSchema, { takenAt: '2026-03-04T09:00:00+02:00' })).toBe(true)
    expect(ok(EventInputSchema, { at: '2026-02-28T23:59:59.999Z', kind: 'note', notes: 'x' })).toBe(true)
  })

  it('refuses a day that does not exist where a full timestamp is asked for (start of stocking, leak test)', () => {
    const livestock = (at: string) => ({ livestock: { group: 'fish', count: 2, at } })
    expect(ok(StartStockingSchema, livestock('2026-02-30T10:00:00Z'))).toBe(false)
    expect(ok(StartStockingSchema, livestock('2026-02-28T10:00:00Z'))).toBe(true)
    expect(ok(STAGE_DATA_SCHEMAS['leak-test'], { startedAt: '2026-04-31T08:00:00Z' })).toBe(false)
    expect(ok(STAGE_DATA_SCHEMAS['leak-test'], { startedAt: '2026-04-30T08:00:00Z' })).toBe(true)
  })

  it('refuses audit filter days that do not exist', () => {
    expect(ok(AuditQuerySchema, { from: '2026-02-30' })).toBe(false)
    expect(ok(AuditQuerySchema, { from: '2026-02-28', to: '2026-03-01' })).toBe(true)
  })

  it('takes as many animals at the start of stocking as the event form does', () => {
    expect(ok(StartStockingSchema, { livestock: { group: 'fish', count: MAX_LIVESTOCK_COUNT } })).toBe(true)
    expect(ok(StartStockingSchema, { livestock: { group: 'fish', count: MAX_LIVESTOCK_COUNT + 1 } })).toBe(false)
    expect(ok(StartStockingSchema, { livestock: { group: 'fish' } })).toBe(false)
    expect(ok(StartStockingSchema, {})).toBe(true)
  })
})
