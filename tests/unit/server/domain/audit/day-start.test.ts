/** The audit trail's day filters start each day on the company's clock, summer time included. */
import { describe, expect, it } from 'vitest'
import { dayStartIn } from '../../../../../server/domain/audit/trail'

describe('dayStartIn', () => {
  it('is midnight UTC in UTC', () => {
    expect(dayStartIn('2026-03-14', 'UTC')).toBe('2026-03-14T00:00:00.000Z')
  })
  // Offsets from the IANA time zone database as Node's ICU ships it.
  it('is the day before in UTC east of Greenwich, and later the same day west of it', () => {
    expect(dayStartIn('2026-12-03', 'Pacific/Auckland')).toBe('2026-12-02T11:00:00.000Z') // NZDT, UTC+13
    expect(dayStartIn('2026-06-03', 'Pacific/Auckland')).toBe('2026-06-02T12:00:00.000Z') // NZST, UTC+12
    expect(dayStartIn('2026-12-03', 'America/Chicago')).toBe('2026-12-03T06:00:00.000Z') // CST, UTC-6
  })
  it('finds the right midnight on the days the clocks change', () => {
    // US summer time 2026: starts Sunday 8 March at 02:00, ends Sunday 1 November at 02:00; midnight is before both.
    expect(dayStartIn('2026-03-08', 'America/Chicago')).toBe('2026-03-08T06:00:00.000Z')
    expect(dayStartIn('2026-03-09', 'America/Chicago')).toBe('2026-03-09T05:00:00.000Z')
    expect(dayStartIn('2026-11-01', 'America/Chicago')).toBe('2026-11-01T05:00:00.000Z')
    expect(dayStartIn('2026-11-02', 'America/Chicago')).toBe('2026-11-02T06:00:00.000Z')
  })
})
