import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { dailyLightIntegral, dliConstant, dliFromSchedule } from '../../../../shared/calc/light-integral'
import { buildLightSchedule } from '../../../../shared/lighting/schedule'

const FC = { seed: 238, numRuns: 150 }

describe('daily light integral', () => {
  it('200 umol m-2 s-1 for 10 h -> 7.2 mol m-2 d-1 (Torres & Lopez, Purdue Extension HO-238-W)', () => {
    // exact unit arithmetic; tolerance is float round-off
    expect(dliConstant(200, 10)).toBeCloseTo(7.2, 12)
  })

  it('a flat schedule at full output reproduces the same 7.2', () => {
    const s = buildLightSchedule({ photoperiodHours: 10, rampMinutes: 0, plateauPercent: 100, startTime: '09:00' })
    expect(dliFromSchedule(s, 200)).toBeCloseTo(7.2, 9)
  })

  it('ramps count half: 9 h with 60 min ramps at 50 % and 200 at full is 200 x 0.5 x 8 h x 0.0036 = 2.88', () => {
    expect(dliFromSchedule(buildLightSchedule(), 200)).toBeCloseTo(2.88, 9)
  })

  it('trapezoids: a triangle peak integrates to half its box', () => {
    expect(dailyLightIntegral([{ minuteOfDay: 600, ppfd: 0 }, { minuteOfDay: 660, ppfd: 100 }, { minuteOfDay: 720, ppfd: 0 }]))
      .toBeCloseTo((100 * 3600) / 1e6, 12)
  })

  it('property: bounded by plateau PPFD x photoperiod and rises with the plateau', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 14 }), fc.integer({ min: 0, max: 30 }), fc.integer({ min: 1, max: 99 }), fc.double({ min: 10, max: 1500, noNaN: true }), (h, ramp, plateau, ppfd) => {
      const low = dliFromSchedule(buildLightSchedule({ photoperiodHours: h, rampMinutes: ramp, plateauPercent: plateau }), ppfd)
      const high = dliFromSchedule(buildLightSchedule({ photoperiodHours: h, rampMinutes: ramp, plateauPercent: plateau + 1 }), ppfd)
      return low > 0 && high > low && low <= dliConstant((ppfd * plateau) / 100, h) + 1e-9
    }), FC)
  })

  it('rejects negative light, unordered samples and impossible hours', () => {
    expect(() => dliConstant(-1, 10)).toThrow(/ppfd/)
    expect(() => dliConstant(200, 25)).toThrow(/hours/)
    expect(() => dailyLightIntegral([{ minuteOfDay: 100, ppfd: 1 }, { minuteOfDay: 50, ppfd: 1 }])).toThrow(/time order/)
    expect(() => dliFromSchedule(buildLightSchedule(), 0)).toThrow(/ppfdAtFullOutput/)
  })
})
