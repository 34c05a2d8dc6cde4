import { describe, expect, it } from 'vitest'
import { tankVolume } from '../../../../shared/calc/volume'
import { netWater, netWaterLitres } from '../../../../shared/plan/net-volume'

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

  it('reads a cube recorded by its length, as older records are, and takes sand and rock off it', () => {
    // 450 mm cube: 91.125 L. The salt for the fill and the ammonia dose both work from this one figure.
    const cube = { shape: 'cube', dimensions: { lengthMm: 450, widthMm: 450, heightMm: 450 }, volumeLitres: 91, sumpLitres: 0 }
    const stages = [{ key: 'substrate', data: { depthMm: 25 } }, { key: 'water-fill', data: { rockKg: 10 } }]
    const expected = tankVolume({ shape: { kind: 'cube', sideMm: 450 }, sandDepthMm: 25, rockKg: 10 }).netL
    expect(netWaterLitres(cube, stages)).toBeCloseTo(expected, 9)
    expect(netWater(cube, stages).fromDimensions).toBe(true)
  })

  it('takes a rock weight being typed in place of the saved one', () => {
    const stages = [{ key: 'water-fill', data: { rockKg: 20 } }]
    const expected = tankVolume({ shape: { kind: 'rectangular', lengthMm: 900, widthMm: 450, heightMm: 500 }, sandDepthMm: 0, rockKg: 5 }).netL + 40
    expect(netWaterLitres(TANK, stages, { rockKg: 5 })).toBeCloseTo(expected, 9)
  })

  it('says when it stood in the recorded volume for missing dimensions', () => {
    expect(netWater({ ...TANK, dimensions: { lengthMm: 900 } }, [])).toEqual({ litres: 242.5, fromDimensions: false })
    expect(netWater(TANK, []).fromDimensions).toBe(true)
  })
})
