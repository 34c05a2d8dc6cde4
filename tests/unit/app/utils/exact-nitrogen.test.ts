import { describe, expect, it } from 'vitest'
import { exactNitrogenOf } from '~/utils/exact-nitrogen'
import { inKitUnits } from '#shared/readings/kit-words'

const morning = { ammoniaN: 0.388, nitriteN: null, nitrateN: 2.5 }
const evening = { ammoniaN: 0.41, nitriteN: 0.05, nitrateN: null }

describe('exactNitrogenOf', () => {
  it('lists ammonia, nitrite and nitrate of each test in order, keeping what was not measured as null', () => {
    expect(exactNitrogenOf([morning, evening])).toEqual([0.388, null, 2.5, 0.41, 0.05, null])
  })

  it('reads the verdict\'s map of tests by id the same as a list', () => {
    expect(exactNitrogenOf({ a: morning, b: evening })).toEqual(exactNitrogenOf([morning, evening]))
  })

  it('gives nothing for no tests', () => {
    expect(exactNitrogenOf([])).toEqual([])
    expect(exactNitrogenOf({})).toEqual([])
  })

  it('hands the kit wording the stored value, so 2 ppm typed as NH3 reads 2 ppm back, not 1.9', () => {
    // 2 ppm as NH3 is 1.645 mg/L as N; the message rounds it to 1.6.
    const typed = { ammoniaN: 2 * 0.8224, nitriteN: null, nitrateN: null }
    const kit = { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' } as const
    expect(inKitUnits('Total ammonia is 1.6 mg/L as N.', kit, exactNitrogenOf({ r1: typed }))).toBe('Total ammonia is 2 ppm as NH3.')
  })
})
