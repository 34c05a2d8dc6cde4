/**
 * The forecast on tanks from the nitrification simulator: kit colour steps, misreads and
 * bacteria that grow on what they are fed, with the proof doses and check tests an
 * aquarist gives. The engine's own verdict on the whole history is the truth.
 */
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../../shared/cycle/engine'
import { forecastCycle, type CycleForecast } from '../../../../../shared/cycle/forecast'
import { DOSE_2PPM_N, simulate, simulationInput, type Simulation } from '../../../../../shared/cycle/simulate'
import { simulatedFishIn, simulatedFishless, simulatedStall } from './simulated-tanks'

const MINUTE = 60_000
const DAY = 86_400_000
const at = (ms: number) => new Date(ms).toISOString()

/** Right after each test: when the engine first proved the cycle, and the date it gave. */
function realCompletion(sim: Simulation): { completedOn: string, knownMs: number } {
  for (const test of sim.tests) {
    const knownMs = Date.parse(test.takenAt) + MINUTE
    const completedOn = evaluateCycle(simulationInput(sim, at(knownMs))).completedOn
    if (completedOn !== null) return { completedOn, knownMs }
  }
  throw new Error('the simulated tank was never proven')
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
