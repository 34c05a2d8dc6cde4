/**
 * The history prepared once and kept between a tank's evaluations (shared/cycle/history.ts
 * `prepareHistory`, `withReadingAdded`, `historyAsOf`) against a full evaluation. Random
 * histories (ordinary cycles, long dosing logs that complete and lose their proof, thresholds
 * that move the limits) arrive one test at a time in a shuffled order, so most arrive backdated,
 * some at the same instant as another, some with a time that does not parse or a value the engine
 * drops; the verdict is taken at `now`, before the latest tests and long after. At every step the
 * verdict from the kept history must equal the verdict from the input alone, and the history cut
 * at `now` the one the engine built before (reference/history-built-at-now.ts), and the forecast
 * made from the kept history the forecast made from the input alone. A history prepared from
 * readings handed over one at a time (rows read from the database) must be the one prepared from
 * the array. Any difference fails.
 */

import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { evaluateCycle, evaluatePrepared } from '../../../../shared/cycle/engine'
import { forecastCycle, forecastPrepared } from '../../../../shared/cycle/forecast'
import { historyAsOf, prepareHistory, withLaterAppended, withReadingAdded, type PreparedHistory } from '../../../../shared/cycle/history'
import { latestValues } from '../../../../shared/cycle/snapshot'
import type { CycleEvent, CycleInput, CycleReading, Thresholds } from '../../../../shared/cycle/types'
import { shuffled } from './arbitraries'
import { caseArb, withOdd, type Case } from './history-cases'
import { buildHistory as buildHistoryBefore } from './reference/history-built-at-now'
import { plainHistory, plainLatest, plainPrepared } from './plain-history'
import { at } from './tank-log'

const RUNS = { seed: 20261203, numRuns: 80 }
const LIMIT_MS = 60_000
/** The verdict is compared at every step of the last arrivals and at every few before them (each comparison runs the engine twice). */
const EVERY_STEP_AT_THE_END = 12
const EVERY_FEW = 5
const HOUR_MS = 3_600_000

function expectSameAsFull(input: CycleInput, prepared: PreparedHistory, c: Case): void {
  const nowMs = Date.parse(input.now)
  expect(plainHistory(historyAsOf(prepared, nowMs))).toEqual(plainHistory(buildHistoryBefore(input.readings, input.events ?? [], nowMs)))
  const copy = { ...input, readings: [...input.readings], events: [...(input.events ?? [])] }
  const keptInput = { tank: input.tank, thresholds: input.thresholds, now: input.now, history: prepared }
  const kept = evaluatePrepared(keptInput, c.options)
  const full = evaluateCycle(copy, c.options)
  expect(kept).toEqual(full)
  expect(forecastPrepared(keptInput, kept)).toEqual(forecastCycle(copy, full))
}

describe('the kept history gives the full evaluation', { timeout: 2 * LIMIT_MS }, () => {
  it('as tests arrive one at a time in any order, at any now', () => {
    fc.assert(fc.property(caseArb, (c) => {
      const base = c.log.input
      const now = new Date(Date.parse(base.now) + c.nowShiftHours * HOUR_MS).toISOString()
      const thresholds: Partial<Thresholds> = { ...base.thresholds, ...c.limits }
      const events: CycleEvent[] = [...(base.events ?? [])]
      const arrivals = shuffled(withOdd(base.readings, c.odd, now), c.seed)
      const first = Math.min(c.startWith, arrivals.length)
      let readings: CycleReading[] = arrivals.slice(0, first)
      let prepared = prepareHistory(readings, events)
      for (const [step, reading] of arrivals.slice(first).entries()) {
        prepared = withReadingAdded(prepared, reading)!
        readings = [...readings, reading]
        const left = arrivals.length - first - step - 1
        if (left < EVERY_STEP_AT_THE_END || step % EVERY_FEW === 0) expectSameAsFull({ ...base, readings, events, thresholds, now }, prepared, c)
      }
      expect(plainLatest(prepared.latest)).toEqual(plainLatest(latestValues(buildHistoryBefore(readings, events, Number.POSITIVE_INFINITY).readings)))
    }), { ...RUNS, interruptAfterTimeLimit: LIMIT_MS })
  })

  it('is the same when the readings come one at a time as rows do', () => {
    fc.assert(fc.property(caseArb, (c) => {
      const readings = withOdd(c.log.input.readings, c.odd, c.log.input.now)
      const events = c.log.input.events ?? []
      function* oneAtATime(): Generator<CycleReading> {
        yield* readings
      }
      // Read without knowing how many (each time from its digits) and with the count given.
      expect(plainPrepared(prepareHistory(oneAtATime(), events))).toEqual(plainPrepared(prepareHistory(readings, events)))
      expect(plainPrepared(prepareHistory(oneAtATime(), events, readings.length))).toEqual(plainPrepared(prepareHistory(readings, events)))
    }), { ...RUNS, interruptAfterTimeLimit: LIMIT_MS })
  })

  it('refuses a test with the time and id of one already kept', () => {
    const readings: CycleReading[] = [{ id: 'a', takenAt: at(1, 8), ammoniaN: 1 }]
    const prepared = prepareHistory(readings, [])
    const added: CycleReading = { id: 'b', takenAt: at(2, 8), ammoniaN: 0 }
    expect(withReadingAdded(prepared, added)?.readings.map(r => r.id)).toEqual(['a', 'b'])
    // The same time and id as a test already kept: only the input's order could tell them apart.
    const twin: CycleReading = { id: 'a', takenAt: at(1, 8), ammoniaN: 0 }
    expect(withReadingAdded(prepared, twin)).toBeUndefined()
  })

  it('refuses a test it already holds, whatever it measured', () => {
    // A copy read after the count it is labelled with may already hold a test it is then told of
    // (engine-input-cache.ts): placed again, a test of pH alone would count twice.
    const waterOnly: CycleReading = { id: 'w', takenAt: at(1, 8), pH: 8.1, salinity: 34 }
    const prepared = prepareHistory([{ id: 'a', takenAt: at(1, 7), ammoniaN: 1 }, waterOnly], [])
    expect(withReadingAdded(prepared, waterOnly)).toBeUndefined()
    // Another test of the same time is placed.
    expect(withReadingAdded(prepared, { ...waterOnly, id: 'x' })?.readings.map(r => r.id)).toEqual(['a', 'w', 'x'])
  })
})

/** Tests and doses after `now`, as the forecast assumes them: some at one instant, some with a value missing. */
const laterArb = fc.record({
  readings: fc.array(fc.record({ hours: fc.integer({ min: 0, max: 400 }), ammoniaN: fc.option(fc.double({ min: 0, max: 4, noNaN: true }), { nil: undefined }), nitriteN: fc.option(fc.constantFrom(0, 0.1, 2), { nil: undefined }), nitrateN: fc.option(fc.constantFrom(2, 10), { nil: undefined }) }), { maxLength: 12 }),
  doses: fc.array(fc.integer({ min: 0, max: 400 }), { maxLength: 6 }),
})

describe('the kept history continued by an assumed future (the forecast\'s projections)', { timeout: 2 * LIMIT_MS }, () => {
  it('is the history prepared from the past and the future together', () => {
    fc.assert(fc.property(caseArb, laterArb, (c, later) => {
      const base = c.log.input
      const now = new Date(Date.parse(base.now) + c.nowShiftHours * HOUR_MS).toISOString()
      const nowMs = Date.parse(now)
      const all = withOdd(base.readings, c.odd, now)
      // A value the engine drops, on a test after now: the past leaves it out.
      if (c.odd.repaired && c.odd.future) all.push({ id: 'odd-future-value', takenAt: new Date(nowMs + 3 * HOUR_MS).toISOString(), ammoniaN: -1, nitrateN: 4 })
      const prepared = prepareHistory(all, base.events ?? [])
      // The past as the forecast keeps it: nothing after now (a time that does not parse stays).
      const past = (iso: string) => !(Date.parse(iso) > nowMs)
      const pastReadings = all.filter(r => past(r.takenAt))
      const pastEvents = (base.events ?? []).filter(e => past(e.at))
      // One millisecond after now at the earliest: the assumed future starts after it.
      const laterReadings: CycleReading[] = later.readings.map((r, i) => ({ id: `later-${i}`, takenAt: new Date(nowMs + 1 + r.hours * HOUR_MS).toISOString(), ammoniaN: r.ammoniaN, nitriteN: r.nitriteN, nitrateN: r.nitrateN }))
      const laterEvents: CycleEvent[] = later.doses.map((h, i) => ({ id: `later-dose-${i}`, at: new Date(nowMs + 1 + h * HOUR_MS).toISOString(), kind: 'ammonia-dose', amount: 2 }))
      const source = { readings: [...pastReadings, ...laterReadings], events: [...pastEvents, ...laterEvents] }
      const continued = withLaterAppended(prepared, nowMs, { readings: laterReadings, events: laterEvents })
      expect(continued).toBeDefined()
      expect(plainPrepared(continued!)).toEqual(plainPrepared(prepareHistory(source.readings, source.events)))
    }), { ...RUNS, numRuns: 300, interruptAfterTimeLimit: LIMIT_MS })
  })

  it('refuses a future that is not after now', () => {
    const readings: CycleReading[] = [{ id: 'a', takenAt: at(1, 8), ammoniaN: 1 }]
    const prepared = prepareHistory(readings, [])
    const nowMs = Date.parse(at(2, 8))
    const atNow: CycleReading = { id: 'b', takenAt: at(2, 8), ammoniaN: 0 }
    expect(withLaterAppended(prepared, nowMs, { readings: [atNow], events: [] })).toBeUndefined()
    const unreadable: CycleEvent = { id: 'e', at: 'tomorrow', kind: 'ammonia-dose', amount: 2 }
    expect(withLaterAppended(prepared, nowMs, { readings: [], events: [unreadable] })).toBeUndefined()
    const after: CycleReading = { id: 'c', takenAt: at(3, 8), ammoniaN: 0 }
    expect(withLaterAppended(prepared, nowMs, { readings: [after], events: [] })?.readings.map(r => r.id)).toEqual(['a', 'c'])
  })
})
