import { describe, expect, it } from 'vitest'
import { EXPORT_MAPPING, importBasis } from '../../../../shared/readings/csv'

const KIT = { ammonia: 'NH4', nitrite: 'NO2', nitrate: 'NO3' } as const

describe('the basis a CSV import reads in', () => {
  it('is the tank\'s remembered kit basis when nothing is chosen, like the entry form', () => {
    expect(importBasis(undefined, { takenAt: 'Date', ammonia: 'Ammonia', nitrite: 'Nitrite', nitrate: 'Nitrate' }, KIT)).toEqual(KIT)
  })

  it('is as N for the columns of Tidewright\'s own export, whose headers say mg/L as N', () => {
    expect(importBasis(undefined, EXPORT_MAPPING, KIT)).toEqual({ ammonia: 'N', nitrite: 'N', nitrate: 'N' })
    expect(importBasis(undefined, { ammonia: 'ammonia_mg_l_n', nitrate: 'Nitrate' }, KIT)).toEqual({ ammonia: 'N', nitrite: 'NO2', nitrate: 'NO3' })
  })

  it('is what the importer chose, whatever the file or the tank', () => {
    const chosen = { ammonia: 'NH3', nitrite: 'N', nitrate: 'N' } as const
    expect(importBasis(chosen, EXPORT_MAPPING, KIT)).toEqual(chosen)
  })
})
