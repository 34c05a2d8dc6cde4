/**
 * Invented but realistic daily test histories for the demo tanks. A small deterministic
 * model of a nitrogen cycle, read through a hobby kit's colour chart, so the demo shows
 * the stepped values clients really enter.
 */
import { fromNitrogen, toNitrogen } from '../../../shared/chemistry/nitrogen'
import { AMMONIA_KIT, NITRATE_KIT, NITRITE_KIT } from '../../../shared/cycle/simulate/kits'
import { seededRandom } from '../../../shared/cycle/simulate/simulate'

export interface SimulatedReading {
  takenAt: string
  ammoniaN: number
  nitriteN: number
  nitrateN: number
  pH: number
  temperatureC: number
  salinity: number
  entered: Record<string, unknown>
}

const AMMONIA_CHART = AMMONIA_KIT.steps
const NITRITE_CHART = NITRITE_KIT.steps
const NITRATE_CHART = NITRATE_KIT.steps

function nearestStep(chart: readonly number[], value: number): number {
  return chart.reduce((best, step) => (Math.abs(step - value) < Math.abs(best - value) ? step : best), chart[0] ?? 0)
}

/** Curve shape of a concentration that rises, holds and decays (days from cycle start). */
function pulse(day: number, riseStart: number, peakDay: number, fallEnd: number, peak: number): number {
  if (day <= riseStart || day >= fallEnd) return 0
  if (day <= peakDay) return peak * (day - riseStart) / (peakDay - riseStart)
  return peak * (1 - (day - peakDay) / (fallEnd - peakDay))
}

export interface CycleCurve {
  /** Total ammonia as mg/L N on a given day. */
  ammoniaN: (day: number) => number
  nitriteN: (day: number) => number
  nitrateN: (day: number) => number
}

/** A fishless cycle dosed to about 2 ppm NH3 on day 0 (common practice, reference §9). */
export const FISHLESS_CURVE: CycleCurve = {
  ammoniaN: day => (day < 7 ? 1.65 : Math.max(0, 1.65 * (1 - (day - 7) / 7))),
  nitriteN: day => pulse(day, 5, 15, 26, 1.4),
  nitrateN: day => Math.max(0, Math.min(6, (day - 9) * 0.35)),
}

/** A fish-in cycle: three hardy fish feed a low, steady ammonia load. */
export const FISH_IN_CURVE: CycleCurve = {
  ammoniaN: day => 0.15 + pulse(day, 2, 6, 14, 0.3),
  nitriteN: day => pulse(day, 5, 12, 24, 0.35),
  nitrateN: day => Math.max(0, (day - 9) * 0.2),
}

export interface HistoryOptions {
  start: Date
  days: number
  curve: CycleCurve
  seed: number
  /** Hour of day (UTC) the client usually tests. */
  hour?: number
  /** Days on which the client skipped the test. */
  skip?: number[]
  /** Extra total ammonia (mg/L N) on given days: a spike. */
  spikes?: Record<number, number>
  /** Tests after this moment have not been taken yet, so they are left out: a demo never shows a future test. */
  notAfter?: Date
}

/** One reading a day, as read off the kit charts, with the kit's own units kept as typed. */
export function simulateHistory(options: HistoryOptions): SimulatedReading[] {
  const random = seededRandom(options.seed)
  const out: SimulatedReading[] = []
  for (let day = 0; day < options.days; day++) {
    if (options.skip?.includes(day)) continue
    const at = new Date(options.start.getTime() + day * 86_400_000)
    at.setUTCHours(options.hour ?? 18, Math.floor(random() * 50), 0, 0)
    if (options.notAfter && at > options.notAfter) break
    const ammoniaPpm = nearestStep(AMMONIA_CHART, fromNitrogen(options.curve.ammoniaN(day) + (options.spikes?.[day] ?? 0), 'NH3'))
    const nitritePpm = nearestStep(NITRITE_CHART, fromNitrogen(options.curve.nitriteN(day), 'NO2'))
    const nitratePpm = nearestStep(NITRATE_CHART, fromNitrogen(options.curve.nitrateN(day), 'NO3'))
    const pH = Math.round((8.05 + random() * 0.2) * 100) / 100
    const temperatureC = Math.round((25.2 + random() * 0.8) * 10) / 10
    const salinity = Math.round((34.6 + random() * 0.6) * 10) / 10
    out.push({
      takenAt: at.toISOString(),
      ammoniaN: toNitrogen(ammoniaPpm, 'NH3'),
      nitriteN: toNitrogen(nitritePpm, 'NO2'),
      nitrateN: toNitrogen(nitratePpm, 'NO3'),
      pH,
      temperatureC,
      salinity,
      entered: {
        ammonia: { value: ammoniaPpm, basis: 'NH3' },
        nitrite: { value: nitritePpm, basis: 'NO2' },
        nitrate: { value: nitratePpm, basis: 'NO3' },
        pH,
        temperature: { value: temperatureC, unit: 'C' },
        salinity: { value: salinity, as: 'practical' },
      },
    })
  }
  return out
}
