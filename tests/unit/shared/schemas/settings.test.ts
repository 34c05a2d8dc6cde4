import * as v from 'valibot'
import { describe, expect, it } from 'vitest'
import { DEFAULT_ORGANISATION_SETTINGS, OrganisationSettingsSchema, parseStoredSettings, type OrganisationSettings } from '../../../../shared/schemas/settings'
import { resolveThresholds, THRESHOLD_SPECS } from '../../../../shared/cycle/thresholds'

const valid = (): OrganisationSettings => structuredClone(DEFAULT_ORGANISATION_SETTINGS) as OrganisationSettings

const fieldsOf = (input: unknown) => {
  const result = v.safeParse(OrganisationSettingsSchema, input)
  return result.success ? [] : result.issues.map(i => i.path?.map(p => String(p.key)).join('.'))
}

describe('stored company settings', () => {
  it('reads an empty or missing value as the defaults', () => {
    expect(parseStoredSettings({})).toEqual(DEFAULT_ORGANISATION_SETTINGS)
    expect(parseStoredSettings(null)).toEqual(DEFAULT_ORGANISATION_SETTINGS)
    expect(parseStoredSettings('not json')).toEqual(DEFAULT_ORGANISATION_SETTINGS)
  })

  it('keeps what is valid and reads a broken value as its default, field by field', () => {
    const read = parseStoredSettings({
      escalationMinutes: 'soon',
      defaultUnits: 'us',
      timeZone: 'Europe/Berlin',
      reminders: { enabled: false, graceMinutes: -5, missedDays: 3 },
      thresholds: { ammoniaZeroN: 0.1, nitriteZeroN: -1, notAThreshold: 4, riseN: 'x' },
    })
    expect(read.escalationMinutes).toBe(60)
    expect(read.defaultUnits).toBe('us')
    expect(read.timeZone).toBe('Europe/Berlin')
    expect(read.reminders).toEqual({ enabled: false, graceMinutes: 60, missedDays: 3 })
    expect(read.thresholds).toEqual({ ammoniaZeroN: 0.1 })
  })

  it('reads an unknown time zone as UTC', () => {
    expect(parseStoredSettings({ timeZone: 'Not/AZone' }).timeZone).toBe('UTC')
  })
})

describe('company settings input', () => {
  it('accepts the defaults', () => {
    expect(fieldsOf(valid())).toEqual([])
  })

  it('names each refused field', () => {
    const input = valid()
    input.escalationMinutes = 2
    input.timeZone = 'Mars/Olympus'
    input.contact.email = 'not an address'
    input.reminders.missedDays = 0
    expect(fieldsOf(input).sort()).toEqual(['contact.email', 'escalationMinutes', 'reminders.missedDays', 'timeZone'])
  })

  it('refuses an unknown threshold and a negative one under its own key', () => {
    const input = { ...valid(), thresholds: { ammoniaZeroN: -0.1, madeUp: 1, nitriteZeroN: 0.1 } }
    expect(fieldsOf(input).sort()).toEqual(['thresholds.ammoniaZeroN', 'thresholds.madeUp'])
  })

  it('refuses a threshold outside the engine\'s own range, naming the range, and never stores one the engine would refuse', () => {
    const { min, max } = THRESHOLD_SPECS.ammoniaZeroN
    const input = { ...valid(), thresholds: { ammoniaZeroN: max * 2 } }
    const result = v.safeParse(OrganisationSettingsSchema, input)
    expect(result.success).toBe(false)
    expect(result.issues?.[0]?.message).toContain(`from ${min} to ${max}`)
    const stored = parseStoredSettings({ thresholds: { ammoniaZeroN: max * 2, nitriteZeroN: THRESHOLD_SPECS.nitriteZeroN.default } })
    expect(stored.thresholds).toEqual({ nitriteZeroN: THRESHOLD_SPECS.nitriteZeroN.default })
    expect(() => resolveThresholds(stored.thresholds)).not.toThrow()
  })

  it('drops keys it does not know, including prototype keys', () => {
    const result = v.parse(OrganisationSettingsSchema, JSON.parse('{"__proto__": {"x": 1}, "extra": 1, ' + JSON.stringify(valid()).slice(1)))
    expect(Object.keys(result).sort()).toEqual(Object.keys(DEFAULT_ORGANISATION_SETTINGS).sort())
  })
})
