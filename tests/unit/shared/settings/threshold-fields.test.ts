import * as v from 'valibot'
import { describe, expect, it } from 'vitest'
import { THRESHOLD_SPECS } from '../../../../shared/cycle/thresholds'
import { DEFAULT_ORGANISATION_SETTINGS, OrganisationSettingsSchema } from '../../../../shared/schemas/settings'
import {
  overridesDiffer, thresholdFields, thresholdFromDisplay, thresholdGroups, thresholdOverridesFromTexts, thresholdTexts, thresholdToDisplay, thresholdUnit,
} from '../../../../shared/settings/threshold-fields'

describe('thresholds in the reader\'s units', () => {
  it('shows temperatures in °F for US units and converts back to °C', () => {
    // 29 °C = 84.2 °F by the definition of the Fahrenheit scale, t/°F = 1.8 t/°C + 32 (NIST SP 811, 2008 edition, from memory).
    expect(thresholdToDisplay('temperatureHardMaxC', 29, 'us')).toBe(84.2)
    expect(thresholdUnit('temperatureHardMaxC', 'us')).toBe('°F')
    expect(thresholdFromDisplay('temperatureHardMaxC', 84.2, 'us')).toBe(29)
    expect(thresholdFromDisplay('temperatureHardMaxC', 80, 'us')).toBe(26.67)
    expect(thresholdToDisplay('temperatureHardMaxC', 29, 'metric')).toBe(29)
    expect(thresholdUnit('temperatureHardMaxC', 'metric')).toBe('°C')
  })

  it('keeps every other limit in its one unit in both systems', () => {
    expect(thresholdUnit('ammoniaZeroN', 'us')).toBe('mg/L as N')
    expect(thresholdToDisplay('ammoniaZeroN', 0.05, 'us')).toBe(0.05)
    expect(thresholdFromDisplay('stableSpanHours', 60, 'us')).toBe(60)
  })

  it('lists every threshold once, with its range in the reader\'s units', () => {
    const fields = thresholdFields('us')
    expect(fields.map(f => f.key).sort()).toEqual(Object.keys(THRESHOLD_SPECS).sort())
    const temp = fields.find(f => f.key === 'temperatureMinC')!
    expect([temp.min, temp.max, temp.default]).toEqual([32, 104, 71.6])
    const groups = thresholdGroups('metric')
    expect(groups.flatMap(g => g.fields)).toHaveLength(fields.length)
    expect(new Set(groups.map(g => g.group)).size).toBe(groups.length)
  })
})

describe('threshold texts to overrides', () => {
  it('stores nothing when nothing was touched', () => {
    const texts = thresholdTexts({}, 'us')
    expect(thresholdOverridesFromTexts(texts, {}, 'us')).toEqual({ overrides: {}, errors: {} })
  })

  it('keeps an untouched stored value exactly, with no drift through °F', () => {
    const loaded = { temperatureMaxC: 28.3 }
    const texts = thresholdTexts(loaded, 'us')
    expect(texts.temperatureMaxC).toBe('82.9')
    expect(thresholdOverridesFromTexts(texts, loaded, 'us').overrides).toEqual({ temperatureMaxC: 28.3 })
  })

  it('turns a changed text into a canonical override the shared schema accepts', () => {
    const texts = { ...thresholdTexts({}, 'us'), temperatureMaxC: '82', ammoniaActionN: '0.3' }
    const { overrides, errors } = thresholdOverridesFromTexts(texts, {}, 'us')
    expect(errors).toEqual({})
    expect(overrides).toEqual({ temperatureMaxC: 27.78, ammoniaActionN: 0.3 })
    const settings = { ...structuredClone(DEFAULT_ORGANISATION_SETTINGS), thresholds: overrides }
    expect(v.safeParse(OrganisationSettingsSchema, settings).success).toBe(true)
  })

  it('reads the default or an emptied field as "use the default" (reset)', () => {
    const loaded = { stableSpanHours: 72, retestHours: 12 }
    const texts = { ...thresholdTexts(loaded, 'metric'), stableSpanHours: '48', retestHours: ' ' }
    expect(thresholdOverridesFromTexts(texts, loaded, 'metric').overrides).toEqual({})
  })

  it('refuses a value outside the range with the range in the reader\'s units, and non-numbers', () => {
    const texts = { ...thresholdTexts({}, 'us'), temperatureMinC: '120', stableSpanHours: '1e3', riseN: 'abc', ammoniaZeroN: '0,1' }
    const { overrides, errors } = thresholdOverridesFromTexts(texts, {}, 'us')
    expect(errors.temperatureMinC).toBe('Give a value from 32 to 104 °F.')
    expect(errors.stableSpanHours).toBe('Give a number.')
    expect(errors.riseN).toBe('Give a number.')
    expect(overrides).toEqual({ ammoniaZeroN: 0.1 })
  })
})

describe('overridesDiffer', () => {
  it('sees an added, removed or changed key, and nothing else', () => {
    expect(overridesDiffer({}, {})).toBe(false)
    expect(overridesDiffer({ riseN: 0.3 }, { riseN: 0.3 })).toBe(false)
    expect(overridesDiffer({ riseN: 0.3 }, {})).toBe(true)
    expect(overridesDiffer({}, { riseN: 0.3 })).toBe(true)
    expect(overridesDiffer({ riseN: 0.3 }, { riseN: 0.4 })).toBe(true)
  })
})
