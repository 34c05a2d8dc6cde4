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

/** Textbook fishless cycle: dose on day 0, a feeding dose on day 10, zero from day 18, clearance dose on day 20, proven on day 21. */
export function textbookFishless(): TankLog {
  return new TankLog('fishless')
    .dose(0, DOSE_2PPM_N)
    .bacteria(0)
    .days(1, {
      ammonia: [1.6, 1.6, 1.5, 1.3, 1.0, 0.6, 0.3, 0.1, 0, 0, 0.3, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.5, 1.4, 1.3, 1.1, 0.8, 0.5, 0.25, 0.1, 0, 0, 0, 0, 0],
      nitrate: [0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.7, 0.9, 1.1, 1.3, 1.5, 1.7, 1.8, 1.9, 1.9, 3.2, 3.3],
    })
    .dose(10, DOSE_2PPM_N / 2)
    .dose(20, DOSE_2PPM_N)
}

/** Fish-in cycle: ammonia spikes past the action level on day 5, a 40 % water change follows, nitrite peaks on day 12. */
export function fishInWithSpike(): TankLog {
  return new TankLog('fish-in')
    .days(1, {
      ammonia: [0.05, 0.15, 0.25, 0.4, 0.6, 0.35, 0.4, 0.3, 0.2, 0.1, 0.05, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0, 0.05, 0.1, 0.15, 0.3, 0.5, 0.7, 0.9, 1.1, 1.2, 1.1, 0.9, 0.6, 0.4, 0.2, 0.05, 0, 0, 0],
      nitrate: [0, 0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0, 1.1, 1.2, 1.2, 1.3],
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

/** Fishless cycle whose tests stop for a week (days 16-22) just as nitrite reaches zero. */
export function missingWeek(): TankLog {
  return new TankLog('fishless')
    .dose(0, DOSE_2PPM_N)
    .bacteria(0)
    .days(1, {
      ammonia: [1.6, 1.6, 1.5, 1.3, 1.0, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.3, 1.0, 0.7, 0.3, 0.1, 0],
      nitrate: [0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.5, 0.7, 0.9, 1.1, 1.3, 1.4],
    })
    .days(23, { ammonia: [0, 0, 0], nitrite: [0, 0, 0], nitrate: [1.6, 3.0, 3.1] })
    .dose(23, DOSE_2PPM_N)
}

/** Fishless cycle with a water change on day 16, two hours after a clearance dose; a second dose on day 18 proves it. */
export function waterChangeMidCycle(): TankLog {
  return new TankLog('fishless')
    .dose(0, DOSE_2PPM_N)
    .bacteria(0)
    .days(1, {
      ammonia: [1.6, 1.6, 1.5, 1.3, 1.0, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.3, 1.0, 0.7, 0.5, 0.2, 0, 0, 0, 0, 0],
      nitrate: [0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.5, 0.7, 0.9, 1.1, 1.3, 1.4, 1.5, 2.2, 2.2, 3.5],
    })
    .dose(16, DOSE_2PPM_N)
    .waterChange(16, 75)
    .dose(18, DOSE_2PPM_N)
}

/** The textbook tank, stocked with too many fish on day 22: ammonia jumps, then the bacteria catch up by day 29. */
export function crashAfterLivestock(): TankLog {
  return textbookFishless()
    .livestock(22, 'fish')
    .days(23, {
      ammonia: [0.6, 0.45, 0.2, 0, 0, 0, 0],
      nitrite: [0.1, 0.3, 0.5, 0.4, 0.05, 0, 0],
      nitrate: [3.3, 3.4, 3.6, 3.9, 4.1, 4.2, 4.2],
    })
}
