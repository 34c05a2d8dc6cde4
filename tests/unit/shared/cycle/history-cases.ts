/**
 * Random tank histories for the tests of a prepared or streamed history against a full
 * evaluation: ordinary cycles and long dosing logs that complete and lose their proof, limits
 * that move, and readings the engine must treat with care (a time that does not parse, a value
 * it drops, a test after now or at its very instant, two at one instant).
 */
import fc from 'fast-check'
import { RULE_OPTIONS_2 } from '../../../../shared/cycle/options'
import type { CycleInput, CycleReading } from '../../../../shared/cycle/types'
import { tankArb, toInput } from './arbitraries'
import { dosingHistoryArb, dosingInput } from './dosing-arbitrary'
import { at } from './tank-log'

const HOUR_MS = 3_600_000

/** Readings the engine must treat with care, mixed into the arrivals. */
export const oddArb = fc.record({
  unparseable: fc.boolean(),
  repaired: fc.boolean(),
  future: fc.boolean(),
  atNow: fc.boolean(),
  sameInstantAs: fc.option(fc.nat(), { freq: 2 }),
})

export const caseArb = fc.record({
  log: fc.oneof(
    tankArb.map((k): { kind: 'cycle', input: CycleInput } => ({ kind: 'cycle', input: toInput(k) })),
    dosingHistoryArb.map((k): { kind: 'dosing', input: CycleInput } => ({ kind: 'dosing', input: { tank: { volumeLitres: 200, cycleMethod: 'fishless', startedAt: at(0, 8) }, ...dosingInput(k), now: at(k.days.length + 1, 12) } })),
  ),
  limits: fc.record({ ammoniaZeroN: fc.constantFrom(0, 0.02, 0.1), nitriteZeroN: fc.constantFrom(0, 0.05), clearanceDays: fc.constantFrom(1, 3) }),
  odd: oddArb,
  seed: fc.integer(),
  startWith: fc.nat({ max: 10 }),
  nowShiftHours: fc.constantFrom(0, -30, -6, 48, 24 * 20),
  options: fc.constantFrom(...RULE_OPTIONS_2),
})

export type Case = typeof caseArb extends fc.Arbitrary<infer T> ? T : never

export function withOdd(readings: readonly CycleReading[], odd: Case['odd'], now: string): CycleReading[] {
  const out = [...readings]
  const nowMs = Date.parse(now)
  if (odd.unparseable) out.push({ id: 'odd-time', takenAt: 'yesterday morning', ammoniaN: 4, nitriteN: 4 })
  if (odd.repaired) out.push({ id: 'odd-value', takenAt: new Date(nowMs - 5 * HOUR_MS).toISOString(), ammoniaN: -1, nitriteN: Number.NaN, nitrateN: 9 })
  // Taken at the very instant of the verdict: it is in the history, one a millisecond later is not.
  if (odd.atNow) out.push({ id: 'odd-at-now', takenAt: now, ammoniaN: 0.5, nitriteN: 0, nitrateN: 3 })
  if (odd.future) out.push({ id: 'odd-future', takenAt: new Date(nowMs + 7 * HOUR_MS).toISOString(), ammoniaN: 2, nitriteN: 2, nitrateN: 1 })
  const twin = odd.sameInstantAs === null || readings.length === 0 ? undefined : readings[odd.sameInstantAs % readings.length]
  // The same minute, entered later, and one entered at the same instant with another id: the total order decides.
  if (twin) {
    out.push({ id: 'odd-twin-later', takenAt: twin.takenAt, enteredAt: now, ammoniaN: 0, nitriteN: 0.3 })
    out.push({ id: 'odd-twin-same', takenAt: twin.takenAt, enteredAt: twin.enteredAt, ammoniaN: 0.05, nitriteN: 0 })
  }
  return out
}
