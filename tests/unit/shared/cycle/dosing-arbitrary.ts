/**
 * fast-check generator of long dosing histories for the course: a dose most days with a test a
 * few hours later showing it arrived and one next morning, with the odd slip (a dose without an
 * amount, a missed test, nitrite back, a water change), same-minute ties, livestock, any
 * clearance window and either 2.x version, so chains of proven doses grow long and break.
 */

import fc from 'fast-check'
import { RULE_OPTIONS_2 } from '../../../../shared/cycle/options'
import type { CycleEvent, CycleReading } from '../../../../shared/cycle/types'
import { at } from './tank-log'

/** Mostly `common`, sometimes one of `rare`: a careful client's days, with the odd slip that breaks a chain. */
function mostly<T>(common: T, ...rare: T[]): fc.Arbitrary<T> {
  return fc.oneof({ weight: 10, arbitrary: fc.constant(common) }, { weight: 1, arbitrary: fc.constantFrom(...rare) })
}

const dayArb = fc.record({
  morning: mostly('zero', 'trace', 'high', 'none'),
  dose: mostly<number | null | undefined>(1.6, 2, 0.4, undefined, null),
  doseHour: fc.integer({ min: 8, max: 12 }),
  // Mostly a test a few hours after the dose that shows it arrived.
  check: mostly<{ hours: number, ammoniaN: number } | null>({ hours: 5, ammoniaN: 1.6 }, null, { hours: 1, ammoniaN: 1.2 }, { hours: 20, ammoniaN: 0.3 }, { hours: 30, ammoniaN: 0 }, { hours: 40, ammoniaN: 1.6 }),
  waterChange: mostly<number | null>(null, 3, 10, 20),
  tie: mostly(false, true),
})

/** A long dosing history: daily doses and tests with the odd slip, water changes, livestock, any window, either 2.x version. */
export const dosingHistoryArb = fc.record({
  days: fc.array(dayArb, { minLength: 20, maxLength: 90, size: 'max' }),
  livestockDay: fc.option(fc.integer({ min: 1, max: 90 }), { freq: 4 }),
  fishIn: fc.boolean(),
  windowHours: fc.constantFrom(6, 20, 30, 30, 48, 72),
  options: fc.constantFrom(...RULE_OPTIONS_2),
})

export type DosingKnobs = typeof dosingHistoryArb extends fc.Arbitrary<infer T> ? T : never

/** The readings and events of one dosing history. */
export function dosingInput(k: DosingKnobs): { readings: CycleReading[], events: CycleEvent[] } {
  const readings: CycleReading[] = []
  const events: CycleEvent[] = []
  k.days.forEach((d, day) => {
    const values = d.morning === 'zero' ? { ammoniaN: 0, nitriteN: 0 } : d.morning === 'trace' ? { ammoniaN: 0, nitriteN: 0.1 } : d.morning === 'high' ? { ammoniaN: 0.5, nitriteN: 0.5 } : null
    if (values) readings.push({ id: `m${day}`, takenAt: at(day, 8), enteredAt: at(day, 8.1), ...values, nitrateN: 2 + day / 10 })
    // A second test in the same minute, entered later: the later entry is the latest.
    if (values && d.tie) readings.push({ id: `m${day}b`, takenAt: at(day, 8), enteredAt: at(day, 8.2), ammoniaN: 0, nitriteN: 0, nitrateN: 2 + day / 10 })
    if (d.dose !== null) events.push({ id: `d${day}`, at: at(day, d.doseHour), kind: 'ammonia-dose', ...(d.dose === undefined ? {} : { amount: d.dose }) })
    if (d.check) readings.push({ id: `c${day}`, takenAt: at(day, d.doseHour + d.check.hours), ammoniaN: d.check.ammoniaN, nitriteN: 0 })
    if (d.waterChange !== null) events.push({ id: `w${day}`, at: at(day, d.waterChange), kind: 'water-change', amount: 25 })
  })
  if (k.livestockDay !== null) events.push({ id: 'fish', at: at(k.livestockDay, 15), kind: 'livestock-added', group: 'fish', amount: 2 })
  return { readings, events }
}
