import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  ACCLIMATION_DEFAULTS,
  LIGHT_SCHEDULE_DEFAULTS,
  POST_CYCLE_PHOTOPERIOD_RANGE_H,
  acclimationPlan,
  buildLightSchedule,
  formatTime,
  intensityAt,
  parseTime,
} from '../../../../shared/lighting/schedule'

const FC = { seed: 9, numRuns: 150 }

describe('buildLightSchedule', () => {
  it('defaults: 9 h from 11:00, 60 min ramps, 50 % plateau (common practice, no published source)', () => {
    const s = buildLightSchedule()
    expect([s.onTime, s.plateauStartTime, s.plateauEndTime, s.offTime]).toEqual(['11:00', '12:00', '19:00', '20:00'])
    expect(s.photoperiodHours).toBeGreaterThanOrEqual(POST_CYCLE_PHOTOPERIOD_RANGE_H[0])
    expect(s.photoperiodHours).toBeLessThanOrEqual(POST_CYCLE_PHOTOPERIOD_RANGE_H[1])
    expect(s.plateauPercent).toBe(LIGHT_SCHEDULE_DEFAULTS.plateauPercent)
  })

  it('ramps linearly: halfway up the ramp is half the plateau; dark outside the photoperiod', () => {
    const input = { startTime: '10:00', photoperiodHours: 10, rampMinutes: 60, plateauPercent: 80 }
    expect(intensityAt(input, parseTime('t', '10:30'))).toBeCloseTo(40, 12)
    expect(intensityAt(input, parseTime('t', '14:00'))).toBe(80)
    expect(intensityAt(input, parseTime('t', '19:45'))).toBeCloseTo(20, 12)
    expect(intensityAt(input, parseTime('t', '20:00'))).toBe(0)
    expect(intensityAt(input, parseTime('t', '09:59'))).toBe(0)
  })

  it('covers 00:00 to 24:00 in order and includes off-grid breakpoints', () => {
    const s = buildLightSchedule({ startTime: '10:07', stepMinutes: 30 })
    expect(s.points[0]?.time).toBe('00:00')
    expect(s.points.at(-1)?.time).toBe('24:00')
    const minutes = s.points.map(p => p.minuteOfDay)
    expect([...minutes].sort((a, b) => a - b)).toEqual(minutes)
    expect(s.points.find(p => p.time === '11:07')?.percent).toBe(s.plateauPercent)
    expect(s.points.find(p => p.time === '10:07')?.percent).toBe(0)
  })

  it('runs past midnight', () => {
    const s = buildLightSchedule({ startTime: '20:00', photoperiodHours: 8, rampMinutes: 30 })
    expect(s.offTime).toBe('04:00')
    expect(s.points[0]?.percent).toBe(s.plateauPercent)
    expect(s.points.at(-1)?.percent).toBe(s.plateauPercent)
    expect(intensityAt({ startTime: '20:00', photoperiodHours: 8, rampMinutes: 30 }, parseTime('t', '12:00'))).toBe(0)
  })

  it('property: intensity stays within 0..plateau and the lit time matches the photoperiod', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 14 }), fc.integer({ min: 0, max: 30 }), fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 1439 }),
      (hours, ramp, plateau, start) => {
        const s = buildLightSchedule({ photoperiodHours: hours, rampMinutes: ramp, plateauPercent: plateau, startTime: formatTime(start), stepMinutes: 1 })
        const inRange = s.points.every(p => p.percent >= 0 && p.percent <= plateau && Number.isFinite(p.percent))
        const lit = s.points.slice(0, -1).filter(p => p.percent > 0).length
        // With a ramp the on and off minutes themselves read 0; without one the on minute is already at plateau.
        const expected = plateau === 0 ? 0 : hours * 60 - (ramp === 0 ? 0 : 1)
        return inRange && lit === expected
      },
    ), FC)
  })

  it('rejects settings that cannot be a schedule', () => {
    expect(() => buildLightSchedule({ photoperiodHours: 25 })).toThrow(/photoperiodHours/)
    expect(() => buildLightSchedule({ photoperiodHours: 2, rampMinutes: 61 })).toThrow(/rampMinutes/)
    expect(() => buildLightSchedule({ plateauPercent: 120 })).toThrow(/plateauPercent/)
    expect(() => buildLightSchedule({ startTime: '25:00' })).toThrow(/startTime/)
    expect(() => buildLightSchedule({ startTime: '9:00' })).toThrow(/startTime/)
    expect(() => buildLightSchedule({ stepMinutes: 7 })).toThrow(/stepMinutes/)
  })
})

describe('acclimationPlan', () => {
  it('steps evenly from start (week 0) to end', () => {
    expect(acclimationPlan(4, 30, 60).map(s => s.plateauPercent)).toEqual([30, 37.5, 45, 52.5, 60])
  })

  it('defaults (common practice, no published source) end at the stated end', () => {
    const plan = acclimationPlan()
    expect(plan).toHaveLength(ACCLIMATION_DEFAULTS.weeks + 1)
    expect(plan.at(-1)?.plateauPercent).toBe(ACCLIMATION_DEFAULTS.endPercent)
  })

  it('property: monotone between the bounds', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 52 }), fc.double({ min: 0, max: 100, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), (w, a, b) => {
      const plan = acclimationPlan(w, Math.min(a, b), Math.max(a, b))
      return plan.every((s, i) => i === 0 || s.plateauPercent >= (plan[i - 1]?.plateauPercent ?? 0))
        && Math.abs((plan.at(-1)?.plateauPercent ?? -1) - Math.max(a, b)) < 1e-9
    }), FC)
  })

  it('rejects bad weeks and percentages', () => {
    expect(() => acclimationPlan(0, 30, 60)).toThrow(/weeks/)
    expect(() => acclimationPlan(2.5, 30, 60)).toThrow(/weeks/)
    expect(() => acclimationPlan(4, -1, 60)).toThrow(/startPercent/)
    expect(() => acclimationPlan(4, 30, 101)).toThrow(/endPercent/)
  })
})
