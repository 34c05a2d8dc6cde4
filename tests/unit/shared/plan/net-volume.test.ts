import { describe, expect, it } from 'vitest'
import { tankVolume } from '../../../../shared/calc/volume'
import { netWaterLitres } from '../../../../shared/plan/net-volume'

const TANK = { shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 500 }, volumeLitres: 202.5, sumpLitres: 40 }

describe('a tank\'s net water', () => {
  it('is the display tank less sand and rock from the plan, plus the sump', () => {
    const stages = [{ key: 'substrate', data: { depthMm: 40 } }, { key: 'water-fill', data: { rockKg: 20 } }]
    const expected = tankVolume({ shape: { kind: 'rectangular', lengthMm: 900, widthMm: 450, heightMm: 500 }, sandDepthMm: 40, rockKg: 20 }).netL + 40
    expect(netWaterLitres(TANK, stages)).toBeCloseTo(expected, 9)
    expect(netWaterLitres(TANK, stages)).toBeLessThan(202.5 + 40)
  })

  it('is the whole tank plus sump before sand and rock are planned', () => {
    expect(netWaterLitres(TANK, [])).toBeCloseTo(202.5 + 40, 9)
  })

  it('falls back to the recorded volume when the dimensions are incomplete', () => {
    expect(netWaterLitres({ ...TANK, dimensions: { lengthMm: 900 } }, [{ key: 'substrate', data: { depthMm: 40 } }])).toBe(242.5)
  })
})
