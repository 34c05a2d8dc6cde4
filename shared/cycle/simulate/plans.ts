/**
 * Ready-made plans for the usual ways a tank is cycled, so the demo seed, scenario
 * tests and back-tests share one set of stories. Doses are the trade's "about 2 ppm"
 * (reference.md section 9; common practice, no published source).
 */

import { toNitrogen } from '../../chemistry/nitrogen'
import type { PlannedDose, SimulationPlan } from './simulate'

/** About 2 ppm as NH3, as mg/L N. */
export const DOSE_2PPM_N = toNitrogen(2, 'NH3')
/** About 1 ppm as NH3, as mg/L N. */
export const DOSE_1PPM_N = toNitrogen(1, 'NH3')

/** The same dose every day from `fromDay` to `toDay` inclusive. */
export function dailyDoses(fromDay: number, toDay: number, amountN: number, hour = 10): PlannedDose[] {
  const doses: PlannedDose[] = []
  for (let day = fromDay; day <= toDay; day += 1) doses.push({ day, hour, amountN })
  return doses
}

/** A dose every `everyDays` days from `fromDay` to `toDay`. */
export function spacedDoses(fromDay: number, toDay: number, everyDays: number, amountN: number, hour = 10): PlannedDose[] {
  const doses: PlannedDose[] = []
  for (let day = fromDay; day <= toDay; day += everyDays) doses.push({ day, hour, amountN })
  return doses
}

/** Options of the usual fishless cycle. */
export interface FishlessOptions {
  seed: number
  start: string
  days: number
  volumeLitres?: number
  /** First day of the daily proof doses (default 24); none when past `days`. */
  proofFromDay?: number
  /** Last day of them (default the last day). */
  proofToDay?: number
  testHour?: number
  skipDays?: number[]
}

/**
 * The usual fishless cycle: bottled bacteria and about 2 ppm on day 0, about 1 ppm every
 * third day from day 9 while the bacteria grow, then from `proofFromDay` about 2 ppm each
 * evening right after the test, checked an hour later, so each day's test shows whether
 * the last evening's dose cleared.
 */
export function fishlessPlan(options: FishlessOptions): SimulationPlan {
  const proofFrom = options.proofFromDay ?? 24
  const hour = options.testHour ?? 18
  const feeding = spacedDoses(9, proofFrom - 1, 3, DOSE_1PPM_N)
  const proof = dailyDoses(proofFrom, options.proofToDay ?? options.days - 1, DOSE_2PPM_N, hour + 1)
  return {
    seed: options.seed,
    start: options.start,
    days: options.days,
    volumeLitres: options.volumeLitres,
    method: 'fishless',
    seeding: 'bottled',
    doses: [{ day: 0, hour: 10, amountN: DOSE_2PPM_N }, ...feeding, ...proof],
    extraTests: proof.map(d => ({ day: d.day, hour: hour + 2 })),
    testHour: hour,
    skipDays: options.skipDays,
  }
}
