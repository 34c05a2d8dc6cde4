import { describe, expect, it } from 'vitest'
import { forecastRangeWords } from '../../../../../shared/cycle/forecast/words'
import { formatDay } from '../../../../../shared/readings/reader-words'

const utc = (iso: string) => formatDay(Date.parse(iso), 'UTC')
const sydney = (iso: string) => formatDay(Date.parse(iso), 'Australia/Sydney')

describe('forecastRangeWords: a range of likely dates, never a promise of one', () => {
  it('names the year once when both ends share it', () => {
    expect(forecastRangeWords({ from: '2026-12-18T09:00:00Z', to: '2026-12-24T09:00:00Z' }, utc)).toBe('between Dec 18 and Dec 24, 2026')
  })

  it('names both years when the range crosses New Year', () => {
    expect(forecastRangeWords({ from: '2026-12-29T09:00:00Z', to: '2027-01-04T09:00:00Z' }, utc)).toBe('between Dec 29, 2026 and Jan 4, 2027')
  })

  it('says one day when both ends fall on the same day of the reader\'s clock', () => {
    expect(forecastRangeWords({ from: '2026-12-18T01:00:00Z', to: '2026-12-18T20:00:00Z' }, utc)).toBe('on Dec 18, 2026')
  })

  it('reads the ends on the reader\'s clock: a late-evening UTC end is the next day in Sydney', () => {
    const range = { from: '2026-12-18T09:00:00Z', to: '2026-12-24T23:30:00Z' }
    expect(forecastRangeWords(range, utc)).toBe('between Dec 18 and Dec 24, 2026')
    // Sydney is eleven hours ahead of UTC in December (IANA tz database).
    expect(forecastRangeWords(range, sydney)).toBe('between Dec 18 and Dec 25, 2026')
  })
})
