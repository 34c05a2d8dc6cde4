/**
 * Pure helpers behind the tank charts: the cycle's phases as shaded spans, free ammonia
 * per reading, and the EPA criteria in the chart's basis.
 */
import { freeAmmonia } from '../chemistry/ammonia'
import { toNitrogen } from '../chemistry/nitrogen'
import { EPA_SALTWATER_ACUTE_NH3, EPA_SALTWATER_CHRONIC_NH3 } from '../cycle/thresholds'
import type { CyclePhase } from '../cycle/types'

/** One reading as the chart route sends it: epoch milliseconds and canonical values (null = not tested). */
export interface ChartPoint {
  t: number
  ammoniaN: number | null
  nitriteN: number | null
  nitrateN: number | null
  pH: number | null
  temperatureC: number | null
  salinity: number | null
}

export interface PhaseSpan {
  phase: CyclePhase
  from: number
  to: number
}

export interface SpanLimits {
  ammoniaZeroN: number
  nitriteZeroN: number
  riseN: number
}

/**
 * The phases of the cycle over time, as spans for shading. The engine reports the phase
 * now; earlier spans follow the same reading of the course: ammonia while ammonia is up
 * and nitrite has not risen, nitrite while nitrite is above zero, settling once both read
 * zero after nitrite was seen, complete from the engine's completion time. The last span
 * always carries the engine's current phase.
 */
export function phaseSpans(points: readonly ChartPoint[], current: CyclePhase, completedOn: number | null, limits: SpanLimits, until: number): PhaseSpan[] {
  const spans: PhaseSpan[] = []
  let nitriteSeen = false
  let sourceSeen = false
  const push = (phase: CyclePhase, t: number) => {
    const last = spans[spans.length - 1]
    if (last && last.phase === phase) return
    if (last) last.to = t
    spans.push({ phase, from: t, to: until })
  }
  for (const p of points) {
    let phase: CyclePhase
    if (completedOn !== null && p.t >= completedOn) phase = 'complete'
    else {
      const ammoniaUp = (p.ammoniaN ?? 0) > limits.ammoniaZeroN
      const nitriteUp = (p.nitriteN ?? 0) > limits.nitriteZeroN
      if (ammoniaUp) sourceSeen = true
      if ((p.nitriteN ?? 0) > limits.riseN) nitriteSeen = true
      if (!sourceSeen && !nitriteUp) phase = 'not-started'
      else if (nitriteUp || (nitriteSeen && ammoniaUp)) phase = 'nitrite'
      else if (ammoniaUp) phase = 'ammonia'
      else phase = nitriteSeen ? 'settling' : 'ammonia'
    }
    push(phase, p.t)
  }
  const last = spans[spans.length - 1]
  const lastT = points[points.length - 1]?.t
  if (!last || lastT === undefined || last.phase === current) return spans
  if (last.from === lastT) {
    spans.pop()
    const before = spans[spans.length - 1]
    if (before) before.to = until
    push(current, lastT)
  }
  else push(current, lastT)
  return spans
}

/** Un-ionized ammonia (mg/L NH3-N) of a reading, or null when a value it needs is missing or outside the formula's range. */
export function freeAmmoniaOf(p: Pick<ChartPoint, 'ammoniaN' | 'pH' | 'temperatureC' | 'salinity'>): number | null {
  if (p.ammoniaN === null || p.pH === null || p.temperatureC === null || p.salinity === null) return null
  try {
    return freeAmmonia(p.ammoniaN, { pH: p.pH, temperatureC: p.temperatureC, salinity: p.salinity })
  }
  catch {
    return null
  }
}

/** US EPA (1989) EPA 440/5-88-004 saltwater criteria for un-ionized ammonia, as mg/L NH3-N. */
export const EPA_CRITERIA_N = Object.freeze({
  chronic: toNitrogen(EPA_SALTWATER_CHRONIC_NH3, 'NH3'),
  acute: toNitrogen(EPA_SALTWATER_ACUTE_NH3, 'NH3'),
})
