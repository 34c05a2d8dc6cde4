/**
 * The forecast on tanks from the nitrification simulator: kit colour steps, misreads and
 * bacteria that grow on what they are fed, with the proof doses and check tests an
 * aquarist gives. The engine's own verdict on the whole history is the truth.
 */
import { describe, expect, it } from 'vitest'
import { forecastCycle, type CycleForecast } from '../../../../../shared/cycle/forecast'
import { DOSE_2PPM_N, simulate, simulationInput, type Simulation } from '../../../../../shared/cycle/simulate'
import { BACKTEST_SCENARIOS, realCompletion as backtestCompletion, type BacktestTank } from '../../../../../bench/backtest'
import { simulatedFishIn, simulatedFishless, simulatedStall } from './simulated-tanks'

const MINUTE = 60_000
const DAY = 86_400_000
const at = (ms: number) => new Date(ms).toISOString()

/** Right after each test: when the engine first proved the cycle, and the date it gave (the back-test's own reckoning). */
function realCompletion(sim: Simulation | BacktestTank): { completedOn: string, knownMs: number } {
  const tank = 'plan' in sim ? { testTimes: sim.tests.map(t => t.takenAt), inputAt: (now: string) => simulationInput(sim, now), cuts: [] } : sim
  const real = backtestCompletion(tank)
  if (!real) throw new Error('the simulated tank was never proven')
  return real
}

const holds = (f: CycleForecast, completedOn: string) =>
  f.completion!.from.slice(0, 10) <= completedOn.slice(0, 10) && completedOn.slice(0, 10) <= f.completion!.to.slice(0, 10)

describe('on a simulated fishless cycle whose proof starts at the first zero test', () => {
  const sim = simulate(simulatedFishless(2, { days: 50, proof: 'prompt' }))
  const real = realCompletion(sim)
  // The first dose after the first week is the first proof dose (the plan feeds smaller doses before it).
  const firstProof = sim.events.find(e => e.kind === 'ammonia-dose' && e.day > 7 && (e.amount ?? 0) >= DOSE_2PPM_N - 0.001)!
  const check = sim.tests.find(t => t.takenAt > firstProof.at)!

  it('reads the check test after a proof dose as the dose arriving, not as ammonia rising again', () => {
    expect(check.ammonia.value).toBeGreaterThanOrEqual(1)
    const f = forecastCycle(simulationInput(sim, at(Date.parse(check.takenAt) + 5 * MINUTE)))
    expect(f.gap).not.toBe('rising')
    expect(f.status).toBe('forecast')
  })

  it('leaves room at the first zero test for nitrite to come back once, at the pace it fell', () => {
    const before = sim.tests.filter(t => t.takenAt < firstProof.at)
    const firstZero = before.at(-1)!
    const peak = before.reduce((p, t) => (t.nitriteN >= p.nitriteN ? t : p))
    const fellMs = Date.parse(firstZero.takenAt) - Date.parse(peak.takenAt)
    const f = forecastCycle(simulationInput(sim, at(Date.parse(firstZero.takenAt) + 5 * MINUTE)))
    expect(f.status).toBe('forecast')
    expect(Date.parse(f.completion!.to) - Date.parse(firstZero.takenAt)).toBeGreaterThanOrEqual(fellMs)
    // Once a full dose has been cleared, the allowance is gone and the range is a few days wide.
    const late = forecastCycle(simulationInput(sim, at(real.knownMs - DAY)))
    expect(Date.parse(late.completion!.to) - Date.parse(late.completion!.from)).toBeLessThan(4 * DAY)
  })

  it('holds the real completion in the last two days before the proof', () => {
    const lastCuts = [2, 1].map(n => forecastCycle(simulationInput(sim, at(real.knownMs - n * DAY))))
    for (const f of lastCuts) {
      expect(f.status).toBe('forecast')
      expect(holds(f, real.completedOn)).toBe(true)
    }
  })
})

describe('on a simulated stall', () => {
  it('says not enough data at every cut', () => {
    const sim = simulate(simulatedStall(4))
    for (let day = 1; day < sim.plan.days; day += 1) {
      const f = forecastCycle(simulationInput(sim, at(Date.parse(sim.plan.start) + day * DAY + 19 * 3_600_000)))
      expect(f.status, `day ${day}`).toBe('not-enough-data')
    }
  })
})

describe('on a simulated fish-in cycle', () => {
  it('forecasts from the falling nitrite and holds the real completion near the end', () => {
    const sim = simulate(simulatedFishIn(5))
    const real = realCompletion(sim)
    const f = forecastCycle(simulationInput(sim, at(real.knownMs - DAY)))
    expect(f.status).toBe('forecast')
    expect(holds(f, real.completedOn)).toBe(true)
  })
})

describe.each([
  ['fishless, proof doses from the first zero', 'narrows'],
  ['slow fishless', 'narrows'],
  // A fish-in tank's range is a day wide from its first forecast (the verdict's zero run is all that is left): it cannot narrow, and must not widen.
  ['fish-in', 'stays narrow'],
] as const)('on simulated tanks, %s (five seeds, cut daily as the back-test cuts them)', (name, shape) => {
  const scenario = BACKTEST_SCENARIOS.find(s => s.name === name)!
  const tanks = [1, 2, 3, 4, 5].map((seed) => {
    const tank = scenario.tank(seed)
    const real = realCompletion(tank)
    // Every daily cut before the proof was known, with its forecast.
    const cuts = tank.cuts.filter(cut => Date.parse(cut) < real.knownMs && Date.parse(cut) < Date.parse(real.completedOn))
      .map(cut => forecastCycle(tank.inputAt(cut)))
    return { seed, real, cuts, ranges: cuts.filter(f => f.status === 'forecast') }
  })
  const widthDays = (f: CycleForecast) => (Date.parse(f.completion!.to) - Date.parse(f.completion!.from)) / DAY

  it('says not enough data for the first ten days', () => {
    for (const { seed, cuts } of tanks) {
      for (const f of cuts.slice(0, 10)) expect(f.status, `seed ${seed}`).toBe('not-enough-data')
    }
  })

  it(`gives ranges before the proof, and the range ${shape} as data arrives`, () => {
    for (const { seed, ranges } of tanks) {
      expect(ranges.length, `seed ${seed}`).toBeGreaterThanOrEqual(4)
      const [first, last] = [widthDays(ranges[0]!), widthDays(ranges.at(-1)!)]
      if (shape === 'narrows') expect(last, `seed ${seed}`).toBeLessThan(first)
      else expect(last, `seed ${seed}`).toBeLessThanOrEqual(first)
    }
  })

  it('holds the real completion day in most ranges', () => {
    const ranges = tanks.flatMap(t => t.ranges.map(f => holds(f, t.real.completedOn)))
    expect(ranges.filter(Boolean).length / ranges.length).toBeGreaterThan(0.5)
  })
})
