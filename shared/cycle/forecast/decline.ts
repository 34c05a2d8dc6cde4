/**
 * Fits the falling stretch of one test curve (ammonia or nitrite) as an exponential
 * decay and says when it should read zero on the kit.
 *
 * Why exponential: the falling stretch is the bacteria outgrowing what is fed to
 * them. Their number grows by a steady fraction per day, so the concentration they
 * leave falls by a steady-or-growing fraction per day. A straight line on a log
 * scale is the simplest curve with that shape; because the true fall speeds up as
 * the bacteria keep growing, recent tests weigh more (WEIGHT_HALF_LIFE_DAYS), and
 * the remaining bend makes the late end of the range the cautious one.
 */

import { DAY_MS, toIso } from '../time'
import { fitLine, t80, type FitPoint } from './fit'
import { MAX_LOG_SCATTER, MIN_FIT_POINTS, MIN_FIT_SPAN_DAYS, WEIGHT_HALF_LIFE_DAYS } from './parameters'
import type { DeclineFit, ForecastGap } from './types'

/** One test value of the series at time t (epoch ms). */
export interface SeriesPoint {
  t: number
  value: number
}

/** A fitted decline, or the reason there is none. */
export type DeclineResult
  = | { ok: true, fit: DeclineFit, zeroFromMs: number, zeroToMs: number, zeroMidMs: number }
    | { ok: false, gap: ForecastGap }

/** The points from the highest test on (the latest one, if the peak repeats). */
function sincePeak(points: readonly SeriesPoint[]): readonly SeriesPoint[] {
  let peak = 0
  for (let i = 1; i < points.length; i += 1) {
    if (points[i]!.value >= points[peak]!.value) peak = i
  }
  return points.slice(peak)
}

/**
 * Fits `points` (oldest first, taken after the last water change) and returns the
 * range in which the series should fall to `zeroLimit` or below.
 */
export function fitDecline(series: DeclineFit['series'], points: readonly SeriesPoint[], zeroLimit: number): DeclineResult {
  const stretch = sincePeak(points)
  const last = stretch[stretch.length - 1]
  if (!last || stretch.length === 1) return { ok: false, gap: 'rising' }
  if (stretch.length < MIN_FIT_POINTS || (last.t - stretch[0]!.t) / DAY_MS < MIN_FIT_SPAN_DAYS) return { ok: false, gap: 'sparse' }
  // A test reading zero inside the stretch is the kit's floor, not a true zero: log of the limit.
  const floor = Math.max(zeroLimit, 1e-6)
  const fitPoints: FitPoint[] = stretch.map(p => ({
    x: (p.t - last.t) / DAY_MS,
    y: Math.log(Math.max(p.value, floor)),
    w: 0.5 ** ((last.t - p.t) / DAY_MS / WEIGHT_HALF_LIFE_DAYS),
  }))
  const line = fitLine(fitPoints)
  if (!line) return { ok: false, gap: 'sparse' }
  if (line.scatter > MAX_LOG_SCATTER) return { ok: false, gap: 'erratic' }
  const q = t80(line.dof)
  const steep = line.slope - q * line.slopeSe
  const shallow = line.slope + q * line.slopeSe
  // Not clearly falling at 80 %: a stall or a plateau, and no date can be read from it.
  if (!(shallow < 0)) return { ok: false, gap: line.slope < 0 ? 'erratic' : 'not-falling' }
  const target = Math.log(floor)
  const daysTo = (level: number, slope: number) => Math.max(0, (target - level) / slope)
  const mid = daysTo(line.level, line.slope)
  const early = daysTo(line.level - q * line.levelSe, steep)
  const late = daysTo(line.level + q * line.levelSe, shallow)
  const fit: DeclineFit = {
    series,
    halvingDays: Math.log(2) / -line.slope,
    since: toIso(stretch[0]!.t),
    tests: stretch.length,
    readsZero: { from: toIso(last.t + early * DAY_MS), to: toIso(last.t + late * DAY_MS) },
  }
  return { ok: true, fit, zeroFromMs: last.t + early * DAY_MS, zeroToMs: last.t + late * DAY_MS, zeroMidMs: last.t + mid * DAY_MS }
}
