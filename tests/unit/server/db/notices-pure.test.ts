import { describe, expect, it } from 'vitest'
import { actionLines, measuredLines } from '../../../../server/domain/alerts/mail'
import { backoffMs, MAX_ATTEMPTS } from '../../../../server/db/outbox'
import { localClock } from '../../../../server/db/reminders'
import { passwordProblem } from '../../../../shared/schemas/account'
import { emailIsMandatory, wantsEmail } from '../../../../shared/notifications/kinds'

describe('alert e-mail words', () => {
  it('states each measured value in the reader\'s units, ammonia on both bases', () => {
    const reading = { takenAt: '2026-01-01T08:00:00Z', ammoniaN: 0.8224, nitriteN: null, nitrateN: null, pH: 8.1, temperatureC: 25, salinity: null }
    // 0.8224 mg/L as N is 1.0 mg/L as NH3 (IUPAC 1996 atomic weights: NH3 -> NH3-N factor 0.8224).
    expect(measuredLines(reading, 'metric')).toEqual(['Total ammonia 0.82 mg/L as N (1 ppm as NH3)', 'pH 8.1', 'Temperature 25 °C'])
    expect(measuredLines(reading, 'us')).toContain('Temperature 77 °F')
    expect(measuredLines(null, 'us')).toEqual([])
  })

  it('adds the water-change percentage only when the message does not say it already', () => {
    expect(actionLines([{ kind: 'water-change', message: 'Change 40 % of the water now.', waterChangePercent: 39.2 }])).toEqual(['Change 40 % of the water now.'])
    expect(actionLines([{ kind: 'water-change', message: 'Change water now.', waterChangePercent: 39.2 }])).toEqual(['Change water now. (change about 40 % of the water)'])
  })
})

describe('company settings', () => {
  it('gives the local date and time in the company\'s zone', () => {
    const at = new Date('2026-07-01T23:30:00Z')
    expect(localClock(at, 'UTC')).toEqual({ date: '2026-07-01', minutes: 23 * 60 + 30 })
    // Central European Summer Time is UTC+2 in July (IANA tz database).
    expect(localClock(at, 'Europe/Berlin')).toEqual({ date: '2026-07-02', minutes: 90 })
    expect(localClock(at, 'Not/AZone')).toEqual({ date: '2026-07-01', minutes: 23 * 60 + 30 })
  })
})

describe('outbox retry', () => {
  it('backs off from 30 s, doubling, to at most an hour', () => {
    expect([1, 2, 3, 4].map(backoffMs)).toEqual([30_000, 60_000, 120_000, 240_000])
    expect(backoffMs(MAX_ATTEMPTS)).toBe(3_600_000)
  })
})

describe('passwords and preferences', () => {
  it('refuses the e-mail address or its name part as a password', () => {
    expect(passwordProblem('Wren@Example.test', 'wren@example.test')).toMatch(/e-mail/)
    expect(passwordProblem('wrencastellanos', 'wrencastellanos@example.test')).toMatch(/e-mail/)
    expect(passwordProblem('coral-sand-ladder', 'wren@example.test')).toBeNull()
  })

  it('keeps e-mail on unless switched off; danger alerts to the assigned aquarist always go', () => {
    expect(wantsEmail({}, 'test-reminder')).toBe(true)
    expect(wantsEmail({ 'test-reminder': false }, 'test-reminder')).toBe(false)
    expect(emailIsMandatory('alert-opened', true)).toBe(true)
    expect(emailIsMandatory('alert-opened', false)).toBe(false)
    expect(emailIsMandatory('alert-escalated', true)).toBe(false)
  })
})
