/**
 * A company's stored settings text is parsed once per distinct text: a save reads the row every
 * time but reuses the parse, and since the parse is shared it is frozen all the way down.
 */
import { describe, expect, it } from 'vitest'
import { PARSED_SETTINGS_KEPT, settingsFromText } from '../../../../../server/domain/settings/parsed-settings'
import { parseStoredSettings } from '../../../../../shared/schemas/settings'

const text = JSON.stringify({ timeZone: 'Europe/Lisbon', escalationMinutes: 30, thresholds: { ammoniaZeroN: 0.1 } })

describe('settingsFromText', () => {
  it('reads the text as parseStoredSettings reads the stored JSON', () => {
    expect(settingsFromText(text)).toEqual(parseStoredSettings(JSON.parse(text)))
    expect(settingsFromText('not json')).toEqual(parseStoredSettings(undefined))
    expect(settingsFromText(undefined)).toEqual(parseStoredSettings(undefined))
  })

  it('gives the same object for the same text', () => {
    expect(settingsFromText(text)).toBe(settingsFromText(String(text)))
  })

  it('gives a new parse for a different text', () => {
    const changed = JSON.stringify({ timeZone: 'Europe/Lisbon', escalationMinutes: 30, thresholds: { ammoniaZeroN: 0.2 } })
    expect(settingsFromText(changed)).not.toBe(settingsFromText(text))
    expect(settingsFromText(changed).thresholds.ammoniaZeroN).toBe(0.2)
  })

  it('is frozen all the way down, so no reader can change what the next one gets', () => {
    const settings = settingsFromText(text)
    expect(() => { (settings as { timeZone: string }).timeZone = 'UTC' }).toThrow(TypeError)
    expect(() => { settings.thresholds.ammoniaZeroN = 5 }).toThrow(TypeError)
    expect(() => { settings.reminders.enabled = false }).toThrow(TypeError)
    expect(() => { settings.contact.email = 'someone@else.test' }).toThrow(TypeError)
    expect(settingsFromText(text).thresholds.ammoniaZeroN).toBe(0.1)
  })

  it('keeps a bounded number of parses, the oldest going first', () => {
    const first = settingsFromText(JSON.stringify({ escalationMinutes: 5 }))
    for (let i = 0; i < PARSED_SETTINGS_KEPT; i++) settingsFromText(JSON.stringify({ escalationMinutes: 6, contact: { address: `Quay ${i}` } }))
    const again = settingsFromText(JSON.stringify({ escalationMinutes: 5 }))
    expect(again).toEqual(first)
    expect(again).not.toBe(first)
  })
})
