import { describe, expect, it } from 'vitest'
import { fitLine, t80 } from '../../../../../shared/cycle/forecast/fit'

describe('weighted least-squares line', () => {
  it('recovers an exact line with no uncertainty', () => {
    const points = [0, 1, 2, 3, 4].map(x => ({ x, y: 2 - 0.5 * x, w: 1 }))
    const fit = fitLine(points)!
    expect(fit.slope).toBeCloseTo(-0.5, 12)
    // The level is given at the last point (x = 4).
    expect(fit.level).toBeCloseTo(0, 12)
    expect(fit.slopeSe).toBeCloseTo(0, 12)
    expect(fit.dof).toBe(3)
  })

  it('matches the ordinary least-squares formulas on scattered points', () => {
    // x 0..3, y 1, 3, 2, 5 (computed by hand): Sxx = 5, Sxy = 5.5, slope 1.1, line at x = 3 is 4.4,
    // residuals -0.1, 0.8, -1.3, 0.6 give SSR = 2.7, s^2 = 2.7 / 2, SE(slope) = sqrt(s^2 / Sxx).
    const fit = fitLine([{ x: 0, y: 1, w: 1 }, { x: 1, y: 3, w: 1 }, { x: 2, y: 2, w: 1 }, { x: 3, y: 5, w: 1 }])!
    expect(fit.slope).toBeCloseTo(1.1, 12)
    expect(fit.level).toBeCloseTo(4.4, 12)
    expect(fit.slopeSe).toBeCloseTo(Math.sqrt(2.7 / 2 / 5), 12)
    // SE of the line at x = 3: s * sqrt(1/n + (3 - 1.5)^2 / Sxx).
    expect(fit.levelSe).toBeCloseTo(Math.sqrt(2.7 / 2 * (1 / 4 + 2.25 / 5)), 12)
  })

  it('weights scale freely: doubling every weight changes nothing', () => {
    const points = [{ x: 0, y: 1, w: 0.5 }, { x: 1, y: 3, w: 1 }, { x: 2, y: 2, w: 0.7 }, { x: 3, y: 5, w: 1 }]
    expect(fitLine(points.map(p => ({ ...p, w: p.w * 2 })))).toEqual(fitLine(points))
  })

  it('gives no line through fewer than three points or one x', () => {
    expect(fitLine([{ x: 0, y: 1, w: 1 }, { x: 1, y: 2, w: 1 }])).toBeNull()
    expect(fitLine([{ x: 1, y: 1, w: 1 }, { x: 1, y: 2, w: 1 }, { x: 1, y: 3, w: 1 }])).toBeNull()
  })

  it('t quantiles for an 80 % interval follow the standard table and approach the normal 1.2816', () => {
    // Student's t, one-sided 0.90, from standard statistical tables.
    expect(t80(1)).toBe(3.078)
    expect(t80(10)).toBe(1.372)
    expect(t80(500)).toBeGreaterThan(1.2816)
    expect(t80(500)).toBeLessThan(1.32)
  })
})
