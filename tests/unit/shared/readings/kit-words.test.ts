import { describe, expect, it } from 'vitest'
import { inKitUnits } from '../../../../shared/readings/kit-words'

const KIT = { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' } as const

describe('inKitUnits (factors: IUPAC atomic weights, NH3-N 0.8224, NO2-N 0.3045, NO3-N 0.2259)', () => {
  it('restates total ammonia and its limit as the kit reads them, dropping the second basis', () => {
    const message = 'Total ammonia is 1.23 mg/L as N (test of 3 Mar 08:00), above the 0.41 mg/L as N (about 0.5 ppm as NH3) limit for a tank with animals in.'
    expect(inKitUnits(message, KIT)).toBe('Total ammonia is 1.5 ppm as NH3 (test of 3 Mar 08:00), above the 0.5 ppm as NH3 limit for a tank with animals in.')
  })
  it('uses the nearest species named before each number', () => {
    expect(inKitUnits('Nitrite is 0.3 mg/L as N while nitrate is 2 mg/L as N.', KIT)).toBe('Nitrite is 0.99 ppm as NO2 while nitrate is 8.9 ppm as NO3.')
  })
  it('takes the species from the ion the engine wrote beside a dose when no species is named before it', () => {
    // The lower-dose action: "Dose about 0.82 mg/L as N (about 1 ppm as NH3) instead of ...".
    expect(inKitUnits('Dose about 0.82 mg/L as N (about 1 ppm as NH3) until nitrite falls.', { ...KIT, ammonia: 'NH4' })).toBe('Dose about 1.1 ppm as NH4 until nitrite falls.')
    // On the ion's own basis the engine's figure, worked from the unrounded 1.645 as N, is kept: 2, not 1.6 / 0.8224 = 1.9.
    expect(inKitUnits('Dose about 0.82 mg/L as N (about 1 ppm as NH3) instead of 1.6 mg/L as N (about 2 ppm as NH3) until nitrite falls.', KIT)).toBe('Dose about 1 ppm as NH3 instead of 2 ppm as NH3 until nitrite falls.')
  })
  it('keeps nitrogen for a kit that reads as N, and free ammonia as NH3 otherwise', () => {
    expect(inKitUnits('Ammonia is 0.5 mg/L as N.', { ...KIT, ammonia: 'N' })).toBe('Ammonia is 0.5 ppm as N.')
    expect(inKitUnits('Free (toxic) ammonia is 0.05 mg/L as N at pH 8.2.', { ...KIT, ammonia: 'NH4' })).toBe('Free (toxic) ammonia is 0.061 ppm as NH3 at pH 8.2.')
  })
  it('restates a rounded figure from the reading it came from, so 2 ppm typed reads 2 ppm back', () => {
    // 2 ppm as NH3 is 1.645 mg/L as N; the message rounds it to 1.6, which alone would read back as 1.9 ppm.
    const typedN = 2 * 0.8224
    expect(inKitUnits('Total ammonia is 1.6 mg/L as N.', KIT)).toBe('Total ammonia is 1.9 ppm as NH3.')
    expect(inKitUnits('Total ammonia is 1.6 mg/L as N.', KIT, [typedN, null])).toBe('Total ammonia is 2 ppm as NH3.')
  })
  it('leaves a message without a named species or concentration alone', () => {
    expect(inKitUnits('Salinity is 38, above 37.', KIT)).toBe('Salinity is 38, above 37.')
    expect(inKitUnits('The limit is 0.4 mg/L as N.', KIT)).toBe('The limit is 0.4 mg/L as N.')
  })
})
