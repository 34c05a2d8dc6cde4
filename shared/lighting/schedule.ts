/**
 * Daily lighting curve (linear ramp up, plateau, ramp down) and the weekly
 * intensity steps that acclimate corals after the cycle.
 *
 * Defaults follow common practice for a newly cycled reef tank (no published
 * source): an 8-10 h photoperiod with ramps and a moderate plateau.
 */

import { assertInRange } from '../units'

const MINUTES_PER_DAY = 1440

/** Photoperiod once the cycle is done, h (common practice, no published source). */
export const POST_CYCLE_PHOTOPERIOD_RANGE_H = [8, 10] as const
/** Photoperiod during the cycle if hardy corals are already in, h (common practice). */
export const CYCLING_PHOTOPERIOD_RANGE_H = [6, 8] as const

/** Tidewright's starting values (common practice, no published source). */
export const LIGHT_SCHEDULE_DEFAULTS = {
  photoperiodHours: 9,
  rampMinutes: 60,
  plateauPercent: 50,
  startTime: '11:00',
  stepMinutes: 15,
} as const

/** Tidewright's default acclimation after the cycle (common practice, no published source). */
export const ACCLIMATION_DEFAULTS = { weeks: 4, startPercent: 30, endPercent: 60 } as const

/** What the aquarist sets on the controller. */
export interface LightScheduleInput {
  /** Hours from lights-on to lights-off, ramps included. */
  photoperiodHours?: number
  /** Length of each of the two ramps, minutes. */
  rampMinutes?: number
  /** Intensity held between the ramps, percent of full output. */
  plateauPercent?: number
  /** Lights-on time, 'HH:MM' (24 h). The period may run past midnight. */
  startTime?: string
  /** Spacing of the sampled curve, minutes; must divide 1440. */
  stepMinutes?: number
}

/** One point of the day's curve. */
export interface LightPoint {
  /** Minutes after midnight, 0-1440. */
  minuteOfDay: number
  /** 'HH:MM'; the closing point is '24:00'. */
  time: string
  percent: number
}

/** Resolved settings, breakpoints and the curve over the whole day. */
export interface LightSchedule {
  photoperiodHours: number
  rampMinutes: number
  plateauPercent: number
  onTime: string
  plateauStartTime: string
  plateauEndTime: string
  offTime: string
  /** Sorted from 00:00 to 24:00; includes every breakpoint, so linear interpolation is exact. */
  points: LightPoint[]
}

/** Parses 'HH:MM' (00:00-23:59) to minutes after midnight. */
export function parseTime(name: string, value: string): number {
  const match = /^([01]\d|2[0-3]):([0-5]\d)$/.exec(value)
  if (!match) throw new RangeError(`${name} must be a time 'HH:MM' from 00:00 to 23:59 (got '${value}')`)
  return Number(match[1]) * 60 + Number(match[2])
}

/** Formats minutes after midnight as 'HH:MM'; 1440 is '24:00', anything else wraps. */
export function formatTime(minuteOfDay: number): string {
  const m = minuteOfDay === MINUTES_PER_DAY ? MINUTES_PER_DAY : ((Math.round(minuteOfDay) % MINUTES_PER_DAY) + MINUTES_PER_DAY) % MINUTES_PER_DAY
  return `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`
}

interface Resolved {
  periodMin: number
  rampMin: number
  plateau: number
  startMin: number
  step: number
}

function resolve(input: LightScheduleInput): Resolved {
  const d = LIGHT_SCHEDULE_DEFAULTS
  const photoperiodHours = input.photoperiodHours ?? d.photoperiodHours
  const rampMinutes = input.rampMinutes ?? d.rampMinutes
  const plateau = input.plateauPercent ?? d.plateauPercent
  const step = input.stepMinutes ?? d.stepMinutes
  assertInRange('photoperiodHours', photoperiodHours, 0, 24)
  const periodMin = photoperiodHours * 60
  assertInRange('rampMinutes', rampMinutes, 0, periodMin / 2)
  assertInRange('plateauPercent', plateau, 0, 100)
  assertInRange('stepMinutes', step, 1, 240)
  if (!Number.isInteger(step) || MINUTES_PER_DAY % step !== 0) {
    throw new RangeError(`stepMinutes must be a whole number of minutes that divides 1440 (got ${step})`)
  }
  return { periodMin, rampMin: rampMinutes, plateau, startMin: parseTime('startTime', input.startTime ?? d.startTime), step }
}

function percentAt(r: Resolved, minuteOfDay: number): number {
  const elapsed = (((minuteOfDay - r.startMin) % MINUTES_PER_DAY) + MINUTES_PER_DAY) % MINUTES_PER_DAY
  if (elapsed >= r.periodMin) return 0
  if (elapsed < r.rampMin) return (r.plateau * elapsed) / r.rampMin
  const remaining = r.periodMin - elapsed
  if (remaining < r.rampMin) return (r.plateau * remaining) / r.rampMin
  return r.plateau
}

/** Intensity (percent) at a minute of the day for the given settings. */
export function intensityAt(input: LightScheduleInput, minuteOfDay: number): number {
  assertInRange('minuteOfDay', minuteOfDay, 0, MINUTES_PER_DAY)
  return percentAt(resolve(input), minuteOfDay)
}

/** The day's intensity curve: ramp up from lights-on, plateau, ramp down to lights-off. */
export function buildLightSchedule(input: LightScheduleInput = {}): LightSchedule {
  const r = resolve(input)
  const breakpoints = [0, r.rampMin, r.periodMin - r.rampMin, r.periodMin]
    .map(offset => (r.startMin + offset) % MINUTES_PER_DAY)
  const minutes = new Set<number>(breakpoints)
  for (let m = 0; m < MINUTES_PER_DAY; m += r.step) minutes.add(m)
  // A breakpoint can fall between samples; the value just before midnight closes the day.
  const sorted = [...minutes].sort((a, b) => a - b)
  const points: LightPoint[] = sorted.map(m => ({ minuteOfDay: m, time: formatTime(m), percent: percentAt(r, m) }))
  points.push({ minuteOfDay: MINUTES_PER_DAY, time: '24:00', percent: percentAt(r, MINUTES_PER_DAY) })
  const [on, plateauStart, plateauEnd, off] = breakpoints.map(formatTime)
  return {
    photoperiodHours: r.periodMin / 60,
    rampMinutes: r.rampMin,
    plateauPercent: r.plateau,
    onTime: on ?? '',
    plateauStartTime: plateauStart ?? '',
    plateauEndTime: plateauEnd ?? '',
    offTime: off ?? '',
    points,
  }
}

/** One week of the acclimation plan. */
export interface AcclimationStep {
  /** 0 is the week the plan starts. */
  week: number
  plateauPercent: number
}

/**
 * Weekly plateau intensities stepping evenly from `startPercent` (week 0) to
 * `endPercent` (week `weeks`), so corals meet full light gradually.
 */
export function acclimationPlan(
  weeks: number = ACCLIMATION_DEFAULTS.weeks,
  startPercent: number = ACCLIMATION_DEFAULTS.startPercent,
  endPercent: number = ACCLIMATION_DEFAULTS.endPercent,
): AcclimationStep[] {
  if (!Number.isInteger(weeks) || weeks < 1 || weeks > 52) throw new RangeError(`weeks must be a whole number from 1 to 52 (got ${weeks})`)
  assertInRange('startPercent', startPercent, 0, 100)
  assertInRange('endPercent', endPercent, 0, 100)
  return Array.from({ length: weeks + 1 }, (_, week) => ({
    week,
    plateauPercent: startPercent + ((endPercent - startPercent) * week) / weeks,
  }))
}
