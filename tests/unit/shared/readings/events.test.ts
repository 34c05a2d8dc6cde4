import { describe, expect, it } from 'vitest'
import { describeEventAmount } from '../../../../shared/readings/events'
import { LIVESTOCK_GROUP_LABELS } from '../../../../shared/sign-off/plan'

// One home for an event's amount in words: the history page and the evidence page both print it.
describe('describeEventAmount', () => {
  it('names the livestock group as the certificate\'s livestock plan does, never by its stored key', () => {
    expect(describeEventAmount('livestock-added', 3, 'metric', 'soft-coral')).toBe(`3 animals (${LIVESTOCK_GROUP_LABELS['soft-coral']})`)
    expect(describeEventAmount('livestock-added', 1, 'us', 'fish')).toBe('1 animal (Fish)')
  })

  it('counts the animals when the group is unknown', () => {
    expect(describeEventAmount('livestock-added', 2, 'metric', null)).toBe('2 animals')
  })

  it('gives a dose in mg/L as N and a water change in the reader\'s units', () => {
    // 2 ppm as NH3 is 1.6448 mg/L as N (0.8224, IUPAC atomic weights); shown to two places.
    expect(describeEventAmount('ammonia-dose', 1.6448, 'us', null)).toBe('1.64 mg/L as N')
    expect(describeEventAmount('water-change', 45.4, 'metric', null)).toBe('45.4 L')
    // 1 US gallon is 3.785411784 L exactly (NIST Handbook 44).
    expect(describeEventAmount('water-change', 3.785411784 * 12, 'us', null)).toBe('12 gal')
  })

  it('says nothing for an event without an amount', () => {
    expect(describeEventAmount('note', null, 'metric', null)).toBe('')
  })
})
