/**
 * Day-by-day histories of real-looking tanks, shared by the scenario and
 * property tests. Values are mg/L as N from one morning test a day. The shapes
 * follow the trade's description of a cycle (reference.md section 9): ammonia
 * rises then falls, nitrite rises then falls, nitrate accumulates (common
 * practice, no published source).
 */

import { TankLog } from './tank-log'

/** About 2 ppm as NH3, expressed as N (2 x 14.00674 / 17.03056). */
export const DOSE_2PPM_N = 1.645

/** Adds proof doses on `days` (10:00) with a check test at 12:00 that shows each arrived. */
export function proofDays(log: TankLog, days: readonly number[], nitrateN: number): TankLog {
  for (const day of days) log.dose(day, DOSE_2PPM_N).test(day, { ammoniaN: 1.6, nitriteN: 0, nitrateN }, 12)
  return log
}

/**
 * Textbook fishless cycle: dose on day 0, a feeding dose on day 10, zero from day 18, then
 * proof doses on days 20, 21 and 22, each seen an hour or two later and cleared by the next
 * morning: proven on day 23.
 */
export function textbookFishless(): TankLog {
  const log = new TankLog('fishless')
    .dose(0, DOSE_2PPM_N)
    .bacteria(0)
    .days(1, {
      ammonia: [1.6, 1.6, 1.5, 1.3, 1.0, 0.6, 0.3, 0.1, 0, 0, 0.3, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.5, 1.4, 1.3, 1.1, 0.8, 0.5, 0.25, 0.1, 0, 0, 0, 0, 0, 0],
      nitrate: [0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.7, 0.9, 1.1, 1.3, 1.5, 1.7, 1.8, 1.9, 1.9, 3.2, 4.6, 6.0],
    })
    .dose(10, DOSE_2PPM_N / 2)
  return proofDays(log, [20, 21, 22], 1.9)
}

/** Fish-in cycle: ammonia spikes past the action level on day 5, a 40 % water change follows, nitrite peaks on day 12, zero from day 18. */
export function fishInWithSpike(): TankLog {
  return new TankLog('fish-in')
    .days(1, {
      ammonia: [0.05, 0.15, 0.25, 0.4, 0.6, 0.35, 0.4, 0.3, 0.2, 0.1, 0.05, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0, 0.05, 0.1, 0.15, 0.3, 0.5, 0.7, 0.9, 1.1, 1.2, 1.1, 0.9, 0.6, 0.4, 0.2, 0.05, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrate: [0, 0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0, 1.1, 1.2, 1.2, 1.3, 1.4, 1.4, 1.5, 1.6, 1.6],
    })
    .waterChange(5, 120)
}

/** Fishless cycle stuck in the nitrite stage: nitrite 2.2-2.6 from day 7 on while pH sags. */
export function nitriteStall(lastDay = 30): TankLog {
  const log = new TankLog('fishless')
    .dose(0, DOSE_2PPM_N)
    .bacteria(0)
    .days(1, {
      ammonia: [1.6, 1.5, 1.2, 0.8, 0.4, 0.1, 0],
      nitrite: [0, 0.1, 0.4, 0.8, 1.2, 1.6, 2.0],
      nitrate: [0, 0, 0, 0.05, 0.1, 0.15, 0.2],
    })
  const flat = [2.3, 2.4, 2.5, 2.3, 2.4, 2.6, 2.4, 2.5, 2.2, 2.4]
  for (let day = 8; day <= lastDay; day += 1) {
    log.test(day, { ammoniaN: 0, nitriteN: flat[day % flat.length] ?? 2.4, nitrateN: 0.25, pH: 7.6 })
  }
  return log
}

/** Two weeks of zero tests in a tank nobody ever fed: no dose, no bacteria, no fish. */
export function neverFed(): TankLog {
  const zeros = Array.from({ length: 14 }, () => 0)
  return new TankLog('fishless').days(1, { ammonia: zeros, nitrite: zeros, nitrate: zeros })
}

/** Fishless cycle whose tests stop for a week (days 16-22) just as nitrite reaches zero; proof doses on days 23-25. */
export function missingWeek(): TankLog {
  const log = new TankLog('fishless')
    .dose(0, DOSE_2PPM_N)
    .bacteria(0)
    .days(1, {
      ammonia: [1.6, 1.6, 1.5, 1.3, 1.0, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.3, 1.0, 0.7, 0.3, 0.1, 0],
      nitrate: [0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.5, 0.7, 0.9, 1.1, 1.3, 1.4],
    })
    .days(23, { ammonia: [0, 0, 0, 0, 0], nitrite: [0, 0, 0, 0, 0], nitrate: [1.6, 3.0, 4.4, 5.8, 5.9] })
  return proofDays(log, [23, 24, 25], 1.6)
}

/** Fishless cycle with a water change on day 16, two hours after a proof dose; doses on days 18-20 prove it on day 21. */
export function waterChangeMidCycle(): TankLog {
  const log = new TankLog('fishless')
    .dose(0, DOSE_2PPM_N)
    .bacteria(0)
    .days(1, {
      ammonia: [1.6, 1.6, 1.5, 1.3, 1.0, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.3, 1.0, 0.7, 0.5, 0.2, 0, 0, 0, 0, 0, 0, 0],
      nitrate: [0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.5, 0.7, 0.9, 1.1, 1.3, 1.4, 1.5, 2.2, 2.2, 3.5, 4.9, 6.2],
    })
    .dose(16, DOSE_2PPM_N)
    .waterChange(16, 75)
  return proofDays(log, [18, 19, 20], 2.2)
}

/** The textbook tank, stocked with too many fish on day 23: ammonia jumps, then the bacteria catch up by day 30. */
export function crashAfterLivestock(): TankLog {
  return textbookFishless()
    .livestock(23, 'fish', 8)
    .days(24, {
      ammonia: [0.6, 0.45, 0.2, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0.1, 0.3, 0.5, 0.4, 0.05, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrate: [6.3, 6.4, 6.6, 6.9, 7.1, 7.2, 7.2, 7.3, 7.4, 7.5, 7.6, 7.7, 7.8],
    })
}
