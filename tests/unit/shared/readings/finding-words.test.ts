/**
 * A client reads each finding as a plain sentence in their kit's units, with the engine's
 * reason as its "why"; the engine's verdict and text stay as they are. Conversion factors:
 * IUPAC atomic weights (NH3-N 0.8224, NO2-N 0.3045). Specific gravity: UNESCO EOS-80 density.
 */
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../shared/cycle'
import { RULES } from '../../../../shared/cycle/registry'
import { ALREADY_PLAIN, CLIENT_FINDING_WORDS, findingForClient, latestMeasured } from '../../../../shared/readings/finding-words'
import type { Reader } from '../../../../shared/readings/reader-words'

const NH3_KIT = { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' } as const
const typedN = 2 * 0.8224 // 2 ppm as NH3, as a client types it
const usClient: Reader = { units: 'us', when: ms => new Date(ms).toISOString(), kit: { basis: NH3_KIT, exactN: [typedN] } }

// A tank with fish in (fish-in cycle) and one bad test: 2 ppm ammonia as NH3, pH 8.1, 25 C.
const verdict = evaluateCycle({
  tank: { volumeLitres: 200, cycleMethod: 'fish-in', startedAt: '2026-11-20T08:00:00Z' },
  readings: [{ id: 'r1', takenAt: '2026-12-01T08:00:00Z', ammoniaN: typedN, nitriteN: 0, nitrateN: 0, pH: 8.1, temperatureC: 25, salinity: 35 }],
  now: '2026-12-01T09:00:00Z',
})
const reading = { ammoniaN: typedN, nitriteN: 0, nitrateN: 0, pH: 8.1, temperatureC: 25, salinity: 35 }

describe('findingForClient', () => {
  it('says an ammonia danger as the kit reads it, with the engine\'s canonical reason only in the why', () => {
    const danger = verdict.findings.find(f => f.ruleId === 'ammonia.action-threshold')!
    expect(danger.message).toContain('mg/L as N')
    const words = findingForClient(danger, reading, usClient)
    expect(words.text).toBe('Total ammonia is 2 ppm as NH3, as your kit reads it: too high for the animals in the tank. Change water now and feed lightly.')
    expect(words.why).toContain('Total ammonia is 2 ppm as NH3')
    expect(words.why).not.toContain('mg/L as N')
  })

  it('keeps the criterion and its source out of the client\'s sentence', () => {
    const finding = { ruleId: 'ammonia.free-chronic', severity: 'caution' as const, message: 'Free (toxic) ammonia is 0.035 mg/L as N at pH 8.3, 27 C, salinity 35, above the US EPA long-term saltwater limit of 0.029 mg/L as N. Feed lightly.' }
    const words = findingForClient(finding, reading, usClient)
    expect(words.text).not.toMatch(/EPA|toxic|mg\/L|un-ionized|free ammonia/i)
    expect(words.text).toContain('2 ppm as NH3')
    expect(words.why).toContain('US EPA long-term saltwater limit')
    expect(words.why).toContain('80.6 °F')
  })

  it('reads temperature in the client\'s units and salinity with its usual specific gravity', () => {
    const hot = findingForClient({ ruleId: 'temperature.range', severity: 'danger', message: 'Temperature is 33 C (test of 2026-12-01 08:00 UTC), outside 18-31 C.' }, { temperatureC: 33 }, usClient)
    expect(hot.text).toBe('The water is 91.4 °F: beyond what reef animals survive for long. Check the heater, the chiller and the room now.')
    const salty = findingForClient({ ruleId: 'salinity.range', severity: 'caution', message: 'Salinity is 35 (test of 2026-12-01 08:00 UTC), outside 36-37.' }, { salinity: 35 }, usClient)
    // UNESCO EOS-80: seawater of S 35 at 25 C is 1023.34 kg/m3, pure water at 25 C 997.05 kg/m3, so SG 25/25 is 1.0264 (from memory).
    expect(salty.text).toContain('Salinity is 35 (about 1.026 SG)')
  })

  it('falls back to the engine\'s text in the reader\'s units when the value a sentence needs was not measured, or for a plain finding', () => {
    const finding = { ruleId: 'nitrite.high-with-animals', severity: 'caution' as const, message: 'Nitrite is 1 mg/L as N (about 3.3 ppm as NO2) on the test of 2026-12-01 08:00 UTC, with animals in: above 0.5 mg/L as N.' }
    expect(findingForClient(finding, {}, usClient)).toEqual({ text: expect.stringContaining('Nitrite is 3.3 ppm as NO2'), why: null })
    const plain = { ruleId: 'cycle.phase', severity: 'info' as const, message: 'Ammonia is being turned into nitrite.' }
    expect(findingForClient(plain, reading, usClient)).toEqual({ text: 'Ammonia is being turned into nitrite.', why: null })
  })

  it('has a sentence for every danger and caution rule, or lists it as already plain', () => {
    const alarming = RULES.filter(r => r.severities.some(s => s !== 'info')).map(r => r.id)
    const missing = alarming.filter(id => !(id in CLIENT_FINDING_WORDS) && !ALREADY_PLAIN.includes(id))
    expect(missing).toEqual([])
    for (const id of [...Object.keys(CLIENT_FINDING_WORDS), ...ALREADY_PLAIN]) expect(RULES.map(r => r.id)).toContain(id)
  })

  it('writes no sentence in the aquarist\'s terms', () => {
    const full = { ammonia: '2 ppm as NH3', nitrite: '1 ppm as NO2', pH: '8.1', temperature: '77 °F', salinity: '35', danger: true }
    for (const [id, sentence] of Object.entries(CLIENT_FINDING_WORDS)) {
      for (const danger of [true, false]) {
        const text = sentence({ ...full, danger }) ?? ''
        expect(text, id).not.toMatch(/mg\/L as N|EPA|un-ionized|criterion|NH3-N/)
        expect(text, id).not.toBe('')
      }
    }
  })
})

describe('latestMeasured', () => {
  it('takes each value from the latest test that has it', () => {
    expect(latestMeasured([{ ammoniaN: 1, pH: 8 }, undefined, { ammoniaN: 2, pH: null, temperatureC: 25 }])).toEqual({ ammoniaN: 2, pH: 8, temperatureC: 25 })
  })
})
