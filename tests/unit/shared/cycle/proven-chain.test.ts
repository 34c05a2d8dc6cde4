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
import { dosingHistoryArb, dosingInput } from './dosing-arbitrary'
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

/** The history as the scan had seen it right after its `index`-th test. */
function upTo(history: History, index: number): History {
  const t = history.readings[index]!.t
  return { ...history, readings: history.readings.slice(0, index + 1), events: history.events.filter(e => e.t <= t) }
}

describe('the proven chain kept as the course goes', () => {
  it('equals the full fold over every dose at every test of the history', () => {
    fc.assert(fc.property(dosingHistoryArb, (k) => {
      const { readings, events } = dosingInput(k)
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
