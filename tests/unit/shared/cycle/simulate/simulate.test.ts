import { describe, expect, it } from 'vitest'
import { toNitrogen } from '../../../../../shared/chemistry/nitrogen'
import {
  advance, AMMONIA_KIT, changeWater, dailyDoses, DOSE_2PPM_N, fishlessPlan, NITRATE_KIT, NITRITE_KIT, readKit, simulate, simulationInput,
  type TankState,
} from '../../../../../shared/cycle/simulate'

const START = '2026-03-02T00:00:00.000Z'
const fresh = (over: Partial<TankState> = {}): TankState => ({ ammoniaN: 0, nitriteN: 0, nitrateN: 0, aobCapacityN: 0.05, nobCapacityN: 0.05, alkalinityDkh: 8, ...over })

describe('kit colour charts', () => {
  it('reads the step a client would pick, on the kit\'s own basis', () => {
    // 1 ppm as NH3 is 0.8224 mg/L as N (IUPAC 1996 atomic weights, reference.md section 3).
    expect(readKit(AMMONIA_KIT, 0.8224)).toEqual({ value: 1, basis: 'NH3', valueN: toNitrogen(1, 'NH3') })
    expect(readKit(AMMONIA_KIT, 0.8224).valueN).toBeCloseTo(0.8224, 4)
    // Below half the first step the water matches the zero card.
    expect(readKit(AMMONIA_KIT, toNitrogen(0.12, 'NH3')).value).toBe(0)
    expect(readKit(AMMONIA_KIT, toNitrogen(0.13, 'NH3')).value).toBe(0.25)
    // Past the top of the chart it reads the top step.
    expect(readKit(NITRITE_KIT, 20).value).toBe(5)
    expect(readKit(NITRATE_KIT, toNitrogen(30, 'NO3')).value).toBe(40)
    expect(readKit(NITRATE_KIT, toNitrogen(7, 'NO3')).value).toBe(5)
    // A misread is one colour step off, never off the chart.
    expect(readKit(NITRITE_KIT, 0, -1).value).toBe(0)
    expect(readKit(NITRITE_KIT, toNitrogen(1, 'NO2'), 1).value).toBe(2)
  })
})

describe('the nitrification model', () => {
  it('turns each mg/L of ammonia-N into one of nitrate-N, using 7.14 mg CaCO3 per mg N', () => {
    // Stoichiometry (reference.md section 10): 7.14 mg CaCO3 per mg ammonia-N; 1 dKH = 17.848 mg/L CaCO3,
    // so a 2 ppm NH3 dose (1.645 mg N/L) uses about 0.66 dKH.
    const after = advance(fresh({ ammoniaN: DOSE_2PPM_N, aobCapacityN: 40, nobCapacityN: 40 }), 72, 0)
    expect(after.ammoniaN + after.nitriteN).toBeLessThan(0.001)
    expect(after.nitrateN).toBeCloseTo(DOSE_2PPM_N, 3)
    expect(8 - after.alkalinityDkh).toBeCloseTo(0.66, 2)
  })

  it('stalls when alkalinity runs out', () => {
    const drained = advance(fresh({ ammoniaN: 2, aobCapacityN: 5, nobCapacityN: 5, alkalinityDkh: 1.5 }), 48, 0)
    expect(drained.ammoniaN).toBe(2)
    expect(drained.nitrateN).toBe(0)
  })

  it('dilutes everything in the water, not the bacteria, in a water change', () => {
    const changed = changeWater(fresh({ ammoniaN: 1, nitriteN: 2, nitrateN: 10, alkalinityDkh: 4, aobCapacityN: 3 }), 0.25, 8)
    expect(changed).toEqual(fresh({ ammoniaN: 0.75, nitriteN: 1.5, nitrateN: 7.5, alkalinityDkh: 5, aobCapacityN: 3 }))
  })
})

describe('simulate', () => {
  const plan = fishlessPlan({ seed: 7, start: START, days: 36 })

  it('is deterministic for a seed, and the seed matters', () => {
    expect(simulate(plan)).toEqual(simulate(plan))
    expect(simulate({ ...plan, seed: 8 }).tests.map(t => t.takenAt)).not.toEqual(simulate(plan).tests.map(t => t.takenAt))
  })

  it('tells the trade\'s story of a fishless cycle: ammonia, then nitrite, then nitrate that accumulates', () => {
    // Typical course (reference.md section 9; common practice, no published source).
    const sim = simulate({ ...plan, misreadChance: 0 })
    const daily = sim.tests.filter(t => t.takenAt.slice(11, 13) === '18')
    const peakDay = (key: 'ammoniaN' | 'nitriteN') => daily.reduce((best, t) => (t[key] > best[key] ? t : best)).day
    expect(peakDay('ammoniaN')).toBeLessThan(peakDay('nitriteN'))
    expect(daily[0]?.ammonia.value).toBe(2)
    const last = daily.at(-1)!
    expect(last.ammoniaN).toBe(0)
    expect(last.nitriteN).toBe(0)
    expect(last.nitrate.value).toBeGreaterThanOrEqual(40)
    // Every value on a test is a colour step of its kit, in the kit's basis.
    for (const t of sim.tests) {
      expect(AMMONIA_KIT.steps).toContain(t.ammonia.value)
      expect(NITRITE_KIT.steps).toContain(t.nitrite.value)
      expect(NITRATE_KIT.steps).toContain(t.nitrate.value)
      expect(t.ammoniaN).toBeCloseTo(toNitrogen(t.ammonia.value, 'NH3'), 12)
    }
  })

  it('logs what the aquarist did, and the check test after each proof dose shows the dose arrived', () => {
    const sim = simulate(plan)
    expect(sim.events.filter(e => e.kind === 'bacteria-dose')).toHaveLength(1)
    const proofDose = sim.events.find(e => e.kind === 'ammonia-dose' && e.day === 30)!
    expect(proofDose.amount).toBeCloseTo(DOSE_2PPM_N, 3)
    const check = sim.tests.find(t => t.day === 30 && t.takenAt > proofDose.at)!
    expect(check.ammonia.value).toBeGreaterThanOrEqual(1)
  })

  it('stalls a long fishless cycle whose alkalinity nobody tops up', () => {
    const sim = simulate({ seed: 3, start: START, days: 40, method: 'fishless', seeding: 'bottled', buffered: false, doses: dailyDoses(0, 39, DOSE_2PPM_N), misreadChance: 0 })
    const last = sim.truth.at(-1)!.state
    expect(last.alkalinityDkh).toBeLessThan(2.5)
    expect(sim.tests.at(-1)!.ammonia.value).toBeGreaterThanOrEqual(4)
    expect(sim.tests.at(-1)!.pH).toBeLessThan(7.8)
  })

  it('lets a live-rock tank with fish process their ammonia without a visible spike while nitrate climbs', () => {
    const sim = simulate({ seed: 5, start: START, days: 28, method: 'fish-in', seeding: 'live-rock', misreadChance: 0, livestock: [{ day: 0, hour: 12, group: 'fish', count: 3, loadNPerDay: 0.4 }] })
    expect(Math.max(...sim.tests.map(t => t.ammonia.value))).toBe(0)
    expect(Math.max(...sim.tests.map(t => t.nitrite.value))).toBe(0)
    expect(sim.tests.at(-1)!.nitrate.value).toBeGreaterThanOrEqual(20)
  })

  it('gives the engine input with stable ids', () => {
    const input = simulationInput(simulate(plan), '2026-04-06T00:00:00.000Z')
    expect(input.tank).toEqual({ volumeLitres: 300, cycleMethod: 'fishless', startedAt: START })
    expect(input.readings[0]?.id).toBe('r000-18')
    expect(input.events?.map(e => e.id).slice(0, 2)).toEqual(['e000-10-bacteria-dose', 'e000-10-ammonia-dose'])
  })
})
