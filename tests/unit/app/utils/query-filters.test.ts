import { describe, expect, it } from 'vitest'
import { filtersFromQuery, narrowingChanged, queryFromFilters } from '../../../../app/utils/query-filters'

const DEFAULTS = { q: '', status: 'active', archived: false, page: 1 }
const CHOICES = { status: ['', 'active', 'open', 'resolved'] }

describe('list filters in the URL query', () => {
  it('reads each filter as the type of its default, and the default where the URL says nothing', () => {
    expect(filtersFromQuery({ q: 'reef', archived: 'true', page: '3' }, DEFAULTS, CHOICES))
      .toEqual({ q: 'reef', status: 'active', archived: true, page: 3 })
    expect(filtersFromQuery({}, DEFAULTS, CHOICES)).toEqual(DEFAULTS)
  })

  it('refuses what a hand-edited URL should not carry: unknown choices, pages below 1 or not whole, odd yes/no', () => {
    expect(filtersFromQuery({ status: 'everything', page: '0', archived: 'maybe' }, DEFAULTS, CHOICES)).toEqual(DEFAULTS)
    expect(filtersFromQuery({ page: '2.5' }, DEFAULTS).page).toBe(1)
    expect(filtersFromQuery({ page: '' }, DEFAULTS).page).toBe(1)
    expect(filtersFromQuery({ q: ['first', 'second'] }, DEFAULTS).q).toBe('first')
  })

  it('keeps an empty choice that differs from the default ("all statuses"), so it survives a reload', () => {
    const query = queryFromFilters({ ...DEFAULTS, status: '' }, DEFAULTS)
    expect(query).toEqual({ status: '' })
    expect(filtersFromQuery({ status: '' }, DEFAULTS, CHOICES).status).toBe('')
  })

  it('writes only what differs from the defaults and keeps query keys that are not filters', () => {
    expect(queryFromFilters(DEFAULTS, DEFAULTS)).toEqual({})
    expect(queryFromFilters({ ...DEFAULTS, q: 'lounge', page: 2 }, DEFAULTS, { tab: 'x', q: 'old' }))
      .toEqual({ tab: 'x', q: 'lounge', page: '2' })
  })

  it('a URL written from filters reads back as the same filters', () => {
    const values = { q: 'Marlowe', status: 'resolved', archived: true, page: 4 }
    const written = queryFromFilters(values, DEFAULTS) as Record<string, string>
    expect(filtersFromQuery(written, DEFAULTS, CHOICES)).toEqual(values)
  })

  it('goes back to the first page when anything but the page changes', () => {
    expect(narrowingChanged({ q: '', page: 3 }, { q: 'a', page: 3 })).toBe(true)
    expect(narrowingChanged({ q: 'a', page: 3 }, { q: 'a', page: 4 })).toBe(false)
  })
})
