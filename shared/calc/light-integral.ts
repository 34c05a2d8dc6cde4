/**
 * Daily light integral, DLI (mol m-2 d-1): PPFD (umol m-2 s-1) integrated over the
 * day (Torres & Lopez, Purdue Extension HO-238-W).
 */

import type { LightSchedule } from '../lighting/schedule'
import { assertFinite, assertInRange, assertPositive } from '../units'

const SECONDS_PER_MINUTE = 60
const MICROMOL_PER_MOL = 1e6

/** DLI at a constant PPFD for `hours`: PPFD x hours x 0.0036. */
export function dliConstant(ppfd: number, hours: number): number {
  assertFinite('ppfd', ppfd, { min: 0 })
  assertInRange('hours', hours, 0, 24)
  return (ppfd * hours * 3600) / MICROMOL_PER_MOL
}

/** A PPFD sample at a minute of the day. */
export interface PpfdPoint {
  minuteOfDay: number
  ppfd: number
}

/** DLI from PPFD samples joined linearly (trapezoids); samples must be in time order within one day. */
export function dailyLightIntegral(points: readonly PpfdPoint[]): number {
  let total = 0
  let previous: PpfdPoint | undefined
  for (const point of points) {
    assertInRange('minuteOfDay', point.minuteOfDay, 0, 1440)
    assertFinite('ppfd', point.ppfd, { min: 0 })
    if (previous) {
      if (point.minuteOfDay < previous.minuteOfDay) {
        throw new RangeError(`points must be in time order (minute ${point.minuteOfDay} after ${previous.minuteOfDay})`)
      }
      total += ((point.ppfd + previous.ppfd) / 2) * (point.minuteOfDay - previous.minuteOfDay) * SECONDS_PER_MINUTE
    }
    previous = point
  }
  return total / MICROMOL_PER_MOL
}

/**
 * DLI of a lighting schedule given the PPFD at the tank's measuring point at 100 %.
 * Assumes output scales linearly with the controller's percent, which holds only
 * roughly for LED drivers; measure PPFD at the plateau when it matters.
 */
export function dliFromSchedule(schedule: LightSchedule, ppfdAtFullOutput: number): number {
  assertPositive('ppfdAtFullOutput', ppfdAtFullOutput)
  return dailyLightIntegral(schedule.points.map(p => ({ minuteOfDay: p.minuteOfDay, ppfd: (p.percent / 100) * ppfdAtFullOutput })))
}
