/**
 * The course keeps the proven chain of doses without folding every dose of the history again
 * at each zero test (course.ts, `provenChain`). This checks it against the fold written out in
 * full, the way the engine did it before: for every test of a random dosing history (doses with
 * and without an amount, arrival tests, misses, water changes, livestock, same-minute ties, any
 * clearance window, both 2.x versions), the course traced up to that test must hold the chain the
 * full fold gives from the doses as they stood then. Any difference fails.
 */

import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { traceCourse, type DoseOutcome } from '../../../../shared/cycle/course'
import { buildHistory, type History } from '../../../../shared/cycle/history'
import { RULE_OPTIONS_2 } from '../../../../shared/cycle/options'
import { DEFAULT_THRESHOLDS, resolveThresholds } from '../../../../shared/cycle/thresholds'
import type { CycleEvent, CycleReading, Thresholds } from '../../../../shared/cycle/types'
import { at } from './tank-log'

const RUNS = { seed: 20261202, numRuns: 200 }
const HOUR_MS = 3_600_000
const CHAIN_MIN_GAP_MS = 12 * HOUR_MS
const CHAIN_MAX_GAP_MS = 36 * HOUR_MS

/** The chain as of `t` for a run that began at `runFirstT`, folded over every dose: the definition. */
function fullChain(doses: readonly DoseOutcome[], runFirstT: number, t: number, th: Thresholds): DoseOutcome[] {
  const windowMs = th.clearanceWindowHours * HOUR_MS
  let chain: DoseOutcome[] = []
  for (const dose of doses) {
    if (dose.t <= runFirstT || dose.t >= t) continue
    if (!dose.diluted && dose.clearedBy === null && t <= dose.t + windowMs) continue
    const amount = dose.event.amount
    const proven = amount !== undefined && amount >= th.clearanceMinDoseN && !dose.diluted && dose.clearedBy !== null && dose.clearedBy.t <= t
    if (!proven) {
      chain = []
      continue
    }
    const previous = chain[chain.length - 1]
    if (previous === undefined || dose.t - previous.t > CHAIN_MAX_GAP_MS) chain = [dose]
    else if (dose.t - previous.t >= CHAIN_MIN_GAP_MS) chain.push(dose)
  }
  return chain
}

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

const historyArb = fc.record({
  days: fc.array(dayArb, { minLength: 20, maxLength: 90, size: 'max' }),
  livestockDay: fc.option(fc.integer({ min: 1, max: 90 }), { freq: 4 }),
  fishIn: fc.boolean(),
  windowHours: fc.constantFrom(6, 20, 30, 30, 48, 72),
  options: fc.constantFrom(...RULE_OPTIONS_2),
})

type Knobs = typeof historyArb extends fc.Arbitrary<infer T> ? T : never

function inputOf(k: Knobs): { readings: CycleReading[], events: CycleEvent[] } {
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

/** The history as the scan had seen it right after its `index`-th test. */
function upTo(history: History, index: number): History {
  const t = history.readings[index]!.t
  return { ...history, readings: history.readings.slice(0, index + 1), events: history.events.filter(e => e.t <= t) }
}

describe('the proven chain kept as the course goes', () => {
  it('equals the full fold over every dose at every test of the history', () => {
    fc.assert(fc.property(historyArb, (k) => {
      const { readings, events } = inputOf(k)
      const thresholds = resolveThresholds({ ...DEFAULT_THRESHOLDS, clearanceWindowHours: k.windowHours })
      const startedMs = Date.parse(at(0, 0))
      const method = k.fishIn ? 'fish-in' as const : 'fishless' as const
      const history = buildHistory(readings, events, Date.parse(at(k.days.length + 3, 0)))
      history.readings.forEach((reading, index) => {
        const course = traceCourse(upTo(history, index), thresholds, method, startedMs, reading.t, k.options)
        // Only where this test extended the run is the chain the one made at this test.
        if (course.run === null || course.run.last !== reading) return
        expect(course.run.provenChain.map(d => d.event.id)).toEqual(fullChain(course.doses, course.run.first.t, reading.t, thresholds).map(d => d.event.id))
      })
    }), RUNS)
  })

  it('finds long chains, so the comparison is not only of empty ones', () => {
    const days = Array.from({ length: 60 }, (_, day) => day)
    const readings: CycleReading[] = days.flatMap(day => [
      { id: `m${day}`, takenAt: at(day, 8), ammoniaN: 0, nitriteN: 0, nitrateN: 5 + day / 10 },
      { id: `c${day}`, takenAt: at(day, 14), ammoniaN: 1.6, nitriteN: 0 },
    ])
    const events: CycleEvent[] = days.map(day => ({ id: `d${day}`, at: at(day, 9), kind: 'ammonia-dose', amount: 1.6 }))
    const history = buildHistory(readings, events, Date.parse(at(61, 0)))
    const thresholds = resolveThresholds(DEFAULT_THRESHOLDS)
    const course = traceCourse(history, thresholds, 'fishless', Date.parse(at(0, 0)), Date.parse(at(60, 9)), RULE_OPTIONS_2[1]!)
    expect(course.run?.provenChain.length).toBeGreaterThan(50)
    expect(course.run?.provenChain.map(d => d.event.id)).toEqual(fullChain(course.doses, course.run!.first.t, course.run!.last.t, thresholds).map(d => d.event.id))
  })
})
