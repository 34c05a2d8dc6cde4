import { describe, expect, it } from 'vitest'
import { formatDay, formatMoment, formatShortDay, formatStamp, forReader } from '../../../../shared/readings/reader-words'

const KIT = { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' } as const
const utcClock = (ms: number) => formatMoment(ms, 'UTC')

// Conversion factors: NIST SP 811 (1 US gallon = 3.785411784 L; °F = °C × 9/5 + 32).
describe('forReader: an engine message in the reader\'s own units, clock and kit', () => {
  const danger = 'Free (toxic) ammonia is 0.05 mg/L as N at pH 8.1, 25.2 C, salinity 34.8. Change 50 % of the water (about 101 L) now.'

  it('a US reader gets Fahrenheit and US gallons, a metric reader degrees Celsius and litres', () => {
    expect(forReader(danger, { units: 'us', when: utcClock })).toBe(
      'Free (toxic) ammonia is 0.05 mg/L as N at pH 8.1, 77.4 °F, salinity 34.8. Change 50 % of the water (about 26.7 gal) now.')
    expect(forReader(danger, { units: 'metric', when: utcClock })).toBe(
      'Free (toxic) ammonia is 0.05 mg/L as N at pH 8.1, 25.2 °C, salinity 34.8. Change 50 % of the water (about 101 L) now.')
  })

  it('converts both ends of a temperature range', () => {
    expect(forReader('Also check temperature 22-29 C and salinity 34-36.', { units: 'us', when: utcClock }))
      .toBe('Also check temperature 71.6-84.2 °F and salinity 34-36.')
  })

  it('never touches concentrations per litre or words that merely end in L or C', () => {
    const message = 'Nitrate is 2 mg/L as N; LPS corals wait; keep 12 L C-clamps away.'
    expect(forReader(message, { units: 'us', when: utcClock })).toBe('Nitrate is 2 mg/L as N; LPS corals wait; keep 3.2 gal C-clamps away.')
  })

  it('restates a moment on the reader\'s clock, so the text agrees with the times beside it', () => {
    const message = 'Total ammonia is 0.82 mg/L as N (test of 2026-12-02 08:01 UTC).'
    expect(forReader(message, { units: 'metric', when: ms => formatMoment(ms, 'America/New_York') }))
      .toBe(`Total ammonia is 0.82 mg/L as N (test of ${formatMoment(Date.UTC(2026, 11, 2, 8, 1), 'America/New_York')}).`)
    // New York is five hours behind UTC in December (IANA tz database).
    expect(formatMoment(Date.UTC(2026, 11, 2, 8, 1), 'America/New_York')).toMatch(/Dec 2.*3:01/)
  })

  it('restates concentrations in the kit\'s basis only when the reader reads a kit', () => {
    const message = 'Total ammonia is 0.82 mg/L as N, above the 0.41 mg/L as N (about 0.5 ppm as NH3) limit.'
    expect(forReader(message, { units: 'us', when: utcClock })).toBe(message)
    expect(forReader(message, { units: 'us', when: utcClock, kit: { basis: KIT, exactN: [] } }))
      .toBe('Total ammonia is 1 ppm as NH3, above the 0.5 ppm as NH3 limit.')
  })
})

describe('forReader: calendar days', () => {
  it('writes the days of a re-test schedule as the reader reads a date, after the moments', () => {
    const message = 'Test ammonia and nitrite every day: 2026-12-02, 2026-12-03, 2026-12-04 (added 2026-12-01 21:08 UTC).'
    expect(forReader(message, { units: 'us', when: utcClock }).replace(/\s/g, ' '))
      .toBe('Test ammonia and nitrite every day: Dec 2, Dec 3, Dec 4 (added Dec 1, 9:08 PM).')
  })
})

describe('one clock for dates and times', () => {
  // 23:30 UTC on Dec 2 is already Dec 3 in Auckland (NZDT, UTC+13 in December) and still Dec 2
  // in Chicago (CST, UTC-6): IANA tz database.
  const lateDec2 = Date.UTC(2026, 11, 2, 23, 30)

  it('writes a day, a short day, a moment and a stamp in one format on a given clock', () => {
    const space = (text: string) => text.replace(/\s/g, ' ')
    expect(formatDay(lateDec2, 'UTC')).toBe('Dec 2, 2026')
    expect(formatDay(lateDec2, 'Pacific/Auckland')).toBe('Dec 3, 2026')
    expect(formatShortDay(lateDec2, 'America/Chicago')).toBe('Dec 2')
    expect(space(formatMoment(lateDec2, 'America/Chicago'))).toBe('Dec 2, 5:30 PM')
    expect(space(formatStamp(lateDec2, 'Pacific/Auckland'))).toBe('Dec 3, 2026, 12:30 PM')
  })

  it('prints each day and moment as toLocaleString does on that clock, asked again and again, and "Invalid Date" for no time', () => {
    const times = [lateDec2, Date.UTC(2027, 2, 28, 1, 30), Date.UTC(2026, 0, 1, 0, 0)]
    for (const zone of ['UTC', 'Pacific/Auckland', 'America/Chicago', 'Europe/London']) {
      for (const ms of [...times, ...times]) {
        const at = new Date(ms)
        expect(formatDay(ms, zone)).toBe(at.toLocaleDateString('en-US', { timeZone: zone, day: 'numeric', month: 'short', year: 'numeric' }))
        expect(formatShortDay(ms, zone)).toBe(at.toLocaleDateString('en-US', { timeZone: zone, day: 'numeric', month: 'short' }))
        expect(formatMoment(ms, zone)).toBe(at.toLocaleString('en-US', { timeZone: zone, day: 'numeric', month: 'short', hour: 'numeric', minute: '2-digit' }))
        expect(formatStamp(ms, zone)).toBe(at.toLocaleString('en-US', { timeZone: zone, day: 'numeric', month: 'short', year: 'numeric', hour: 'numeric', minute: '2-digit' }))
      }
    }
    expect(formatDay(Number.NaN, 'UTC')).toBe('Invalid Date')
    expect(formatMoment(Date.parse('not a time'), 'UTC')).toBe('Invalid Date')
  })

  it('does not depend on the machine\'s own time zone once a clock is given', () => {
    const machine = process.env.TZ
    try {
      process.env.TZ = 'Pacific/Kiritimati'
      expect(formatDay(lateDec2, 'UTC')).toBe('Dec 2, 2026')
    }
    finally {
      process.env.TZ = machine
    }
  })
})

describe('formatDay: a day on the reader\'s clock', () => {
  // Half past eleven at night in UTC is already the next morning in Sydney (eleven hours ahead in
  // December, daylight saving) and still the evening before in New York (five behind): IANA tz database.
  const lateEvening = Date.UTC(2026, 11, 18, 23, 30)

  it('writes month, day and year in the time zone it is given', () => {
    expect(formatDay(lateEvening, 'UTC')).toBe('Dec 18, 2026')
    expect(formatDay(lateEvening, 'Australia/Sydney')).toBe('Dec 19, 2026')
    expect(formatDay(Date.UTC(2026, 11, 19, 2, 0), 'America/New_York')).toBe('Dec 18, 2026')
  })

  it('names the same day formatMoment names, without the time', () => {
    for (const zone of ['UTC', 'Australia/Sydney', 'America/New_York']) {
      expect(formatMoment(lateEvening, zone).startsWith(formatDay(lateEvening, zone).replace(/, \d{4}$/, ''))).toBe(true)
    }
  })
})
