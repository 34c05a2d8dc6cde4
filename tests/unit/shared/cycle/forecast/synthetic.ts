/**
 * Synthetic cycle curves for the forecast's tests: smooth textbook shapes read
 * through a hobby kit's colour steps with seeded noise. They follow the trade's
 * description of a cycle (reference.md section 9: ammonia falls, nitrite rises then
 * falls, nitrate accumulates; common practice, no published source). The fall of
 * nitrite is the Gompertz shape a pool takes when eaten by bacteria growing by a
 * steady fraction a day, so the curve bends downward as real ones do.
 */

import { nitrogenFraction } from '../../../../../shared/chemistry/nitrogen'
import type { CycleMethod } from '../../../../../shared/vocabulary'
import { TankLog } from '../tank-log'
import { DOSE_2PPM_N } from '../scenarios'

/** Kit colour steps as printed on common cards (ppm as the ion), converted to mg/L as N. */
const AMMONIA_STEPS = [0, 0.25, 0.5, 1, 2, 4, 8].map(v => v * nitrogenFraction('NH3'))
const NITRITE_STEPS = [0, 0.25, 0.5, 1, 2, 5].map(v => v * nitrogenFraction('NO2'))

/** Nearest colour step on a log scale (how a person matches a colour). */
function kit(value: number, steps: readonly number[]): number {
  if (value < steps[1]! / 2) return 0
  let best = steps[1]!
  for (const s of steps.slice(1)) if (Math.abs(Math.log(s / value)) < Math.abs(Math.log(best / value))) best = s
  return best
}

/** Small seeded generator (mulberry32): the same seed gives the same tank. */
export function seeded(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** Shape of one synthetic cycle. */
export interface CurveShape {
  /** Day ammonia is half gone. */
  ammoniaHalfDay: number
  /** Day nitrite starts to fall. */
  nitritePeakDay: number
  /** Peak nitrite, mg/L as N. */
  nitritePeakN: number
  /** Daily growth rate of the nitrite eaters (per day). */
  growth: number
  /** Multiplicative noise of a reading before the kit rounds it (log-scale SD). */
  noise: number
  /** Last day tested. */
  lastDay: number
  method: CycleMethod
}

export const TEXTBOOK: CurveShape = { ammoniaHalfDay: 6, nitritePeakDay: 12, nitritePeakN: 1.5, growth: 0.35, noise: 0.1, lastDay: 40, method: 'fishless' }
export const SLOW: CurveShape = { ammoniaHalfDay: 12, nitritePeakDay: 26, nitritePeakN: 1.5, growth: 0.16, noise: 0.1, lastDay: 70, method: 'fishless' }
/** Nitrite climbs and never falls: the eaters do not grow (low alkalinity, no NOB). */
export const STALL: CurveShape = { ammoniaHalfDay: 6, nitritePeakDay: 12, nitritePeakN: 1.5, growth: 0, noise: 0.1, lastDay: 40, method: 'fishless' }
export const FISH_IN: CurveShape = { ammoniaHalfDay: 8, nitritePeakDay: 13, nitritePeakN: 0.6, growth: 0.3, noise: 0.1, lastDay: 45, method: 'fish-in' }

function nitriteAt(shape: CurveShape, day: number): number {
  const rise = 1 / (1 + Math.exp(-(day - shape.ammoniaHalfDay) / 1.5))
  if (day <= shape.nitritePeakDay) return shape.nitritePeakN * rise
  // Gompertz fall: the pool is eaten by a population growing by `growth` a day.
  return shape.nitritePeakN * rise * Math.exp(-0.15 * (Math.exp(shape.growth * (day - shape.nitritePeakDay)) - 1))
}

/**
 * A daily-tested tank with the given shape. A fishless tank is dosed on day 0 and,
 * once both curves read zero, gets the clearance dose after each test; a fish-in tank
 * has fish from day 0.
 */
export function syntheticTank(shape: CurveShape, seed: number): TankLog {
  const random = seeded(seed)
  const jitter = () => Math.exp(shape.noise * (random() + random() + random() - 1.5) * 2)
  const log = new TankLog(shape.method)
  const start = shape.method === 'fishless' ? DOSE_2PPM_N : 0.6
  if (shape.method === 'fishless') log.dose(0, DOSE_2PPM_N).bacteria(0)
  else log.livestock(0, 'fish', 8)
  let nitrate = 0
  for (let day = 1; day <= shape.lastDay; day += 1) {
    const ammonia = kit((start / (1 + Math.exp((day - shape.ammoniaHalfDay) / 1.2))) * jitter(), AMMONIA_STEPS)
    const nitrite = kit(nitriteAt(shape, day) * jitter(), NITRITE_STEPS)
    nitrate += 0.12
    log.test(day, { ammoniaN: ammonia, nitriteN: nitrite, nitrateN: Math.round(nitrate * 10) / 10 })
    // The proof the verdict asks for: a full dose after each zero test, checked a few hours later.
    if (shape.method === 'fishless' && ammonia === 0 && nitrite === 0 && day > shape.nitritePeakDay) {
      log.dose(day, DOSE_2PPM_N).test(day, { ammoniaN: kit(DOSE_2PPM_N, AMMONIA_STEPS), nitriteN: 0, nitrateN: Math.round(nitrate * 10) / 10 }, 13)
    }
  }
  return log
}
