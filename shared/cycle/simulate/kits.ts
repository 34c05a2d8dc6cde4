/**
 * Hobby test kits as a client reads them: a colour chart with a few steps, each step
 * on the kit's own basis. A reading is the chart step whose colour is closest; colour
 * differences on these charts grow with the ratio of concentrations, so closeness is
 * judged on a log scale (common practice, no published source).
 */

import { fromNitrogen, toNitrogen, type NitrogenSpecies } from '../../chemistry/nitrogen'

/** One kit's colour chart. */
export interface KitChart {
  /** The basis every step is printed in, e.g. ppm "as NH3" (total ammonia expressed as NH3). */
  readonly basis: NitrogenSpecies
  /** Colour steps in ppm (mg/L) on `basis`, ascending, starting at 0. */
  readonly steps: readonly number[]
}

/** Total ammonia kit: 0, 0.25, 0.5, 1, 2, 4, 8 ppm, total ammonia expressed as NH3. */
export const AMMONIA_KIT: KitChart = Object.freeze({ basis: 'NH3', steps: Object.freeze([0, 0.25, 0.5, 1, 2, 4, 8]) })
/** Nitrite kit: 0, 0.25, 0.5, 1, 2, 5 ppm as NO2. */
export const NITRITE_KIT: KitChart = Object.freeze({ basis: 'NO2', steps: Object.freeze([0, 0.25, 0.5, 1, 2, 5]) })
/** Nitrate kit: 0, 5, 10, 20, 40, 80, 160 ppm as NO3. */
export const NITRATE_KIT: KitChart = Object.freeze({ basis: 'NO3', steps: Object.freeze([0, 5, 10, 20, 40, 80, 160]) })

/** The index of the step a client picks for a true concentration in mg/L as N. */
export function kitStepIndex(chart: KitChart, valueN: number): number {
  const value = fromNitrogen(Math.max(0, valueN), chart.basis)
  const steps = chart.steps
  const first = steps[1] ?? 0
  // Below half the first colour step the water looks like the zero card.
  if (value < first / 2) return 0
  let best = 1
  for (let i = 2; i < steps.length; i += 1) {
    const step = steps[i] ?? 0
    const current = steps[best] ?? 0
    if (Math.abs(Math.log(value / step)) < Math.abs(Math.log(value / current))) best = i
  }
  return best
}

/** A kit reading: the step in the kit's basis, and the same value in mg/L as N. */
export interface KitReading {
  readonly value: number
  readonly basis: NitrogenSpecies
  readonly valueN: number
}

/** The reading at step `index` of `chart` (clamped to the chart). */
export function kitReadingAt(chart: KitChart, index: number): KitReading {
  const i = Math.max(0, Math.min(chart.steps.length - 1, index))
  const value = chart.steps[i] ?? 0
  return { value, basis: chart.basis, valueN: toNitrogen(value, chart.basis) }
}

/** Reads a true concentration (mg/L as N) off the chart; `shift` moves the pick by whole steps (a misread). */
export function readKit(chart: KitChart, valueN: number, shift = 0): KitReading {
  return kitReadingAt(chart, kitStepIndex(chart, valueN) + shift)
}
