import { describe, expect, it } from 'vitest'
import { fromCelsius, temperatureUnit, thicknessFromMm, thicknessToMm, thicknessUnit, toCelsius } from '../../../../app/utils/unit-inputs'

// Exact definitions (NIST SP 811, appendix B): 1 in = 25.4 mm; t(°F) = 1.8 t(°C) + 32.
describe('form inputs in the person\'s own units', () => {
  it('asks a US aquarist for the mixing temperature in °F and keeps °C on the server', () => {
    expect(temperatureUnit('us')).toBe('°F')
    expect(temperatureUnit('metric')).toBe('°C')
    expect(fromCelsius(25, 'us')).toBe(77)
    expect(toCelsius(77, 'us')).toBeCloseTo(25, 10)
    expect(fromCelsius(15, 'us')).toBe(59)
    expect(fromCelsius(32, 'us')).toBe(89.6)
    expect(toCelsius(26.5, 'metric')).toBe(26.5)
  })

  it('asks for panel thickness in inches in the US (3/8 in glass) and in millimetres elsewhere', () => {
    expect(thicknessUnit('us')).toBe('in')
    expect(thicknessUnit('metric')).toBe('mm')
    expect(thicknessToMm(0.375, 'us')).toBeCloseTo(9.525, 10)
    expect(thicknessFromMm(9.525, 'us')).toBe(0.375)
    expect(thicknessFromMm(12, 'metric')).toBe(12)
    // A stored 10 mm panel shown in inches and saved unchanged stays within a hundredth of a millimetre.
    expect(Math.abs(thicknessToMm(thicknessFromMm(10, 'us'), 'us') - 10)).toBeLessThan(0.01)
  })
})
