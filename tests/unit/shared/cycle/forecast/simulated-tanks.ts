/**
 * Simulated tanks for the forecast's tests and back-test, from the nitrification
 * simulator (`shared/cycle/simulate`): seeded, so the same seed gives the same tank.
 * Each seed also varies the bacteria's growth rates by up to 20 % either way, so a
 * family of seeds is a family of tanks, not one tank read with different misreads.
 */
import {
  dailyDoses, DEFAULT_RATES, DOSE_2PPM_N, fishlessPlan, seededRandom, type ModelRates, type SimulationPlan, simulate,
} from '../../../../../shared/cycle/simulate'

export const SIMULATION_START = '2026-03-02T00:00:00.000Z'

/** Growth rates varied by up to 20 % either way per seed, and slowed by `pace` (1: the model's own). */
export function ratesFor(seed: number, pace = 1): ModelRates {
  const random = seededRandom(seed * 7919 + 13)
  const vary = () => 0.8 + 0.4 * random()
  return { ...DEFAULT_RATES, aobGrowthPerDay: DEFAULT_RATES.aobGrowthPerDay * pace * vary(), nobGrowthPerDay: DEFAULT_RATES.nobGrowthPerDay * pace * vary() }
}

/** The first day after the first week on which both kits read zero, with no proof doses given. */
function firstZeroDay(plan: SimulationPlan): number | undefined {
  const quiet = simulate({ ...plan, doses: plan.doses?.filter(d => d.amountN < DOSE_2PPM_N || d.day === 0), extraTests: [] })
  return quiet.tests.find(t => t.day > 7 && t.ammonia.value === 0 && t.nitrite.value === 0)?.day
}

/**
 * A fishless cycle (bottled bacteria, the simulator's usual plan). `proof`: 'prompt'
 * starts the daily proof doses (each checked two hours later) at the first zero test, as
 * the verdict asks; a number starts them on that day whatever the kits read.
 */
export function simulatedFishless(seed: number, options: { days: number, pace?: number, proof: 'prompt' | number }): SimulationPlan {
  const rates = ratesFor(seed, options.pace)
  const plain = { ...fishlessPlan({ seed, start: SIMULATION_START, days: options.days, proofFromDay: options.days }), rates }
  const proofFromDay = options.proof === 'prompt' ? (firstZeroDay(plain) ?? options.days) : options.proof
  return { ...fishlessPlan({ seed, start: SIMULATION_START, days: options.days, proofFromDay }), rates }
}

/** Nobody tops up alkalinity while ammonia is dosed daily: nitrification drains it and stops. */
export function simulatedStall(seed: number, days = 45): SimulationPlan {
  return { seed, start: SIMULATION_START, days, method: 'fishless', seeding: 'bottled', buffered: false, doses: dailyDoses(0, days - 1, DOSE_2PPM_N), rates: ratesFor(seed) }
}

/** Three fish in an unseeded tank from day 0, fed as usual. */
export function simulatedFishIn(seed: number, days = 60): SimulationPlan {
  const load = 0.2 + 0.1 * seededRandom(seed)()
  return {
    seed, start: SIMULATION_START, days, method: 'fish-in', seeding: 'none', rates: ratesFor(seed),
    livestock: [{ day: 0, hour: 12, group: 'fish', count: 3, loadNPerDay: load }],
  }
}
