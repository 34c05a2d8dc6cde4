/**
 * A history streamed past once and held only in its latest part (shared/cycle/history-stream.ts,
 * window.ts, reads.ts) against a full evaluation. For random histories (history-cases.ts), windows
 * from a few hours to longer than the history, and every rule set version, the verdict and the
 * forecast made from the window must equal those made from the whole input, or the engine must say
 * it cannot (BeyondWindow) so the caller evaluates the whole history: a window never answers
 * differently; a stream that later tests were appended to, evaluated at later moments, likewise.
 * A realistic long history (a fish-in cycle, then two years of upkeep) must be
 * judged from its window without falling back. Each input is made the way the server makes it
 * (`streamedInput`, engine-input-cache.ts): `HistoryStream.read`, then `inputAt`.
 */

import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { evaluateCycle, evaluatePrepared } from '../../../../shared/cycle/engine'
import { forecastCycle, forecastPrepared } from '../../../../shared/cycle/forecast'
import { buildHistory } from '../../../../shared/cycle/history'
import { HistoryStream, type StreamedInputHead } from '../../../../shared/cycle/history-stream'
import { CURRENT_RULE_OPTIONS, RULE_OPTIONS_2_0_0, type RuleOptions } from '../../../../shared/cycle/options'
import { BeyondWindow } from '../../../../shared/cycle/window'
import type { CycleInput, CycleReading, Thresholds } from '../../../../shared/cycle/types'
import { caseArb, withOdd } from './history-cases'
import { plainReading } from './plain-history'
import { at, TankLog } from './tank-log'

const RUNS = { seed: 20261203, numRuns: 400 }
const LIMIT_MS = 60_000
const HOUR_MS = 3_600_000
const DAY_MS = 24 * HOUR_MS

/** The readings in time order as rows come from the database; a time that does not parse anywhere (here last). */
function inTimeOrder(readings: readonly CycleReading[]): CycleReading[] {
  const readable = readings.filter(r => Number.isFinite(Date.parse(r.takenAt)))
  const unreadable = readings.filter(r => !Number.isFinite(Date.parse(r.takenAt)))
  return [...readable.sort((a, b) => Date.parse(a.takenAt) - Date.parse(b.takenAt)), ...unreadable]
}

/** The value of `run`, or undefined when it threw BeyondWindow (any other error fails the test). */
function unlessBeyond<T>(run: () => T): T | undefined {
  try {
    return run()
  }
  catch (error) {
    if (error instanceof BeyondWindow) return undefined
    throw error
  }
}

describe('a streamed history held in its window gives the full evaluation, or says it cannot', { timeout: 2 * LIMIT_MS }, () => {
  it('for random histories, windows and rule set versions', () => {
    let judged = 0
    let judgedFromPart = 0
    let forecast = 0
    let fittedFromPart = 0
    let cases = 0
    fc.assert(fc.property(caseArb, fc.constantFrom(0.25, 1, 3, 10, 20, 40, 10_000), (c, windowDays) => {
      cases += 1
      const base = c.log.input
      const now = new Date(Date.parse(base.now) + c.nowShiftHours * HOUR_MS).toISOString()
      const thresholds: Partial<Thresholds> = { ...base.thresholds, ...c.limits }
      const input: CycleInput = { ...base, readings: inTimeOrder(withOdd(base.readings, c.odd, now)), thresholds, now }
      const streamed = HistoryStream.read(input, input.readings, input.events, windowDays, c.options)?.inputAt(input, c.options)
      expect(streamed).toBeDefined()
      // What it holds: the whole history's tests from the window's start on, no others.
      const startMs = Date.parse(now) - windowDays * DAY_MS
      expect(streamed!.history.readings.map(plainReading)).toEqual(buildHistory(input.readings, input.events ?? [], Date.parse(now)).readings.filter(r => r.t >= startMs).map(plainReading))
      const full = evaluateCycle(input, c.options)
      const verdict = unlessBeyond(() => evaluatePrepared(streamed!, c.options))
      if (verdict === undefined) return
      judged += 1
      if (streamed!.history.window!.startMs > Number.NEGATIVE_INFINITY) judgedFromPart += 1
      expect(verdict).toEqual(full)
      if (c.options !== CURRENT_RULE_OPTIONS) return
      const predicted = unlessBeyond(() => forecastPrepared(streamed!, verdict))
      if (predicted === undefined) return
      forecast += 1
      if (predicted.status === 'forecast' && streamed!.history.window!.startMs > Number.NEGATIVE_INFINITY) fittedFromPart += 1
      expect(predicted).toEqual(forecastCycle(input, full))
    }), { ...RUNS, interruptAfterTimeLimit: LIMIT_MS })
    // The comparison is not empty: many windows settle the verdict, some holding only part of
    // the history (a window of hours rarely does: the rules look back days), and many the forecast.
    expect(judged).toBeGreaterThan(cases / 3)
    expect(judgedFromPart).toBeGreaterThan(cases / 10)
    expect(forecast).toBeGreaterThan(cases / 10)
    // Some forecasts fitted their curves and projected the engine from a window holding part of the history.
    expect(fittedFromPart).toBeGreaterThan(0)
  })

  it('goes on with later tests as a stream read again would, at later moments', () => {
    let judged = 0
    fc.assert(fc.property(caseArb, fc.constantFrom(1, 3, 20, 10_000), fc.nat(), (c, windowDays, pick) => {
      const base = c.log.input
      const thresholds: Partial<Thresholds> = { ...base.thresholds, ...c.limits }
      const readings = inTimeOrder(base.readings)
      if (readings.length < 2) return
      const first = 1 + (pick % (readings.length - 1))
      const readAt = Date.parse(readings[first - 1]!.takenAt)
      // Events after the moment first read at would make it read again: they are left out of this case.
      const events = (base.events ?? []).filter(e => Date.parse(e.at) <= readAt)
      const head = (nowMs: number) => ({ tank: base.tank, thresholds, now: new Date(nowMs).toISOString() })
      let stream = HistoryStream.read(head(readAt), readings.slice(0, first), events, windowDays, c.options)!
      for (let i = first; i < readings.length; i += 1) {
        const appended = stream.withTestAppended(readings[i]!)
        // A test at the very time of the latest one is folded only by reading again.
        stream = appended ?? HistoryStream.read(head(readAt), readings.slice(0, i + 1), events, windowDays, c.options)!
        const nowMs = Date.parse(readings[i]!.takenAt) + (i % 3) * 3_600_000
        const input = stream.inputAt(head(nowMs), c.options)
        if (input === undefined) {
          // Its window grew to twice its days: read again from here.
          stream = HistoryStream.read(head(nowMs), readings.slice(0, i + 1), events, windowDays, c.options)!
          continue
        }
        const verdict = unlessBeyond(() => evaluatePrepared(input, c.options))
        if (verdict === undefined) continue
        judged += 1
        expect(verdict).toEqual(evaluateCycle({ ...head(nowMs), readings: readings.slice(0, i + 1), events }, c.options))
      }
    }), { ...RUNS, numRuns: 60, interruptAfterTimeLimit: LIMIT_MS })
    expect(judged).toBeGreaterThan(100)
  })

  it('judges two years of upkeep after a fish-in cycle from its last 60 days', () => {
    const log = new TankLog('fish-in')
    // The cycle: ammonia up and down, nitrite after it, nitrate left behind.
    log.days(0, {
      ammonia: [0.1, 0.3, 0.5, 0.8, 1, 1, 0.8, 0.5, 0.3, 0.2, 0.1, 0.05, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0, 0.1, 0.3, 0.6, 1, 1.2, 1, 0.8, 0.5, 0.3, 0.2, 0.1, 0.05, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrate: [0.5, 0.5, 0.5, 1, 1, 2, 2, 3, 4, 5, 6, 7, 8, 9, 10, 10, 11, 11, 12, 12, 12, 13, 13, 13, 14, 14, 14, 15],
    })
    log.livestock(40, 'fish')
    // Upkeep: a test each morning and evening, a water change each week, nitrate climbing between changes.
    for (let day = 28; day < 760; day += 1) {
      log.test(day, { ammoniaN: 0, nitriteN: 0, nitrateN: 5 + (day % 7) * 1.5, alkalinityDkh: 8.5, calciumMgL: 420, magnesiumMgL: 1300 }, 8)
      log.test(day, { ammoniaN: 0, nitriteN: 0 }, 20)
      if (day % 7 === 6) log.waterChange(day, 30)
    }
    const input = log.input(760, 9)
    input.readings = inTimeOrder(input.readings)
    const streamed = HistoryStream.read(input, input.readings, input.events, 60)!.inputAt(input)!
    expect(streamed.history.readings.length).toBeLessThanOrEqual(2 * 60)
    const full = evaluateCycle(input)
    expect(full.phase).toBe('complete')
    const verdict = evaluatePrepared(streamed)
    expect(verdict).toEqual(full)
    expect(forecastPrepared(streamed, verdict)).toEqual(forecastCycle(input, full))
  })

  it('forecasts a cycle lost after a year from its window: the curves since the last water change, the engine projected from the fold', () => {
    const log = new TankLog('fish-in')
    log.days(0, {
      ammonia: [0.2, 0.5, 1, 1, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0, 0, 0.2, 0.8, 1.5, 1.5, 1, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrate: [1, 1, 2, 3, 4, 6, 8, 10, 11, 12, 13, 14, 14, 15, 15, 16, 16, 17, 17, 18],
    })
    for (let day = 20; day < 400; day += 1) {
      log.test(day, { ammoniaN: 0, nitriteN: 0, nitrateN: 8 + (day % 7) }, 8)
      if (day % 7 === 6) log.waterChange(day, 30)
    }
    // A year on, the filter was cleaned too hard: ammonia back, then nitrite, now falling.
    const ammonia = [0.5, 0.8, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0, 0, 0]
    const nitrite = [0, 0.3, 1, 1.6, 1.8, 1.5, 1.2, 1, 0.8, 0.6, 0.45, 0.35]
    ammonia.forEach((a, i) => {
      log.test(400 + i, { ammoniaN: a, nitriteN: nitrite[i], nitrateN: 10 + i }, 8)
      log.test(400 + i, { ammoniaN: a, nitriteN: nitrite[i] }, 20)
    })
    const input = log.input(411, 21)
    input.readings = inTimeOrder(input.readings)
    const full = evaluateCycle(input)
    const expected = forecastCycle(input, full)
    expect(expected.status).toBe('forecast')
    const streamed = HistoryStream.read(input, input.readings, input.events, 30)!.inputAt(input)!
    expect(streamed.history.window!.startMs).toBeGreaterThan(Number.NEGATIVE_INFINITY)
    const verdict = evaluatePrepared(streamed)
    expect(verdict).toEqual(full)
    expect(forecastPrepared(streamed, verdict)).toEqual(expected)
  })

  it('is not made from readings out of time order', () => {
    const readings: CycleReading[] = [{ id: 'b', takenAt: at(2), ammoniaN: 0 }, { id: 'a', takenAt: at(1), ammoniaN: 1 }]
    const input: CycleInput = { tank: { volumeLitres: 100, cycleMethod: 'fishless', startedAt: at(0) }, readings, events: [], now: at(3) }
    expect(HistoryStream.read(input, readings, [], 30)).toBeUndefined()
    // One whose time does not parse may come anywhere.
    const withUnreadable = [readings[1]!, { id: 'x', takenAt: 'soon', ammoniaN: 3 }, readings[0]!]
    expect(HistoryStream.read(input, withUnreadable, [], 30)?.inputAt(input)).toBeDefined()
  })

  it('answers only the moment, limits, tank and rule set it was read for', () => {
    const log = new TankLog('fishless').days(0, { ammonia: [0, 1, 2, 1, 0], nitrite: [0, 0, 1, 2, 0] })
    const input = log.input(5)
    const streamed = HistoryStream.read(input, input.readings, input.events, 30)!.inputAt(input)!
    expect(evaluatePrepared(streamed)).toEqual(evaluateCycle(input))
    expect(() => evaluatePrepared({ ...streamed, now: at(6) })).toThrow(BeyondWindow)
  })

  it('is refused by the stream and by the engine for the same other limits, tank or rule set', () => {
    const log = new TankLog('fishless').days(0, { ammonia: [0, 1, 2, 1, 0], nitrite: [0, 0, 1, 2, 0] })
    const input = log.input(5)
    const stream = HistoryStream.read(input, input.readings, input.events, 30)!
    const streamed = stream.inputAt(input)!
    // Limits equal one for one, given as another object, are the same limits.
    expect(stream.inputAt({ ...input, thresholds: { ...input.thresholds } })).toBeDefined()
    const asks: [what: string, head: StreamedInputHead, options: RuleOptions][] = [
      ['other limits', { ...input, thresholds: { ...input.thresholds, ammoniaZeroN: 0.1 } }, CURRENT_RULE_OPTIONS],
      ['another cycle method', { ...input, tank: { ...input.tank, cycleMethod: 'fish-in' } }, CURRENT_RULE_OPTIONS],
      ['another start', { ...input, tank: { ...input.tank, startedAt: at(-1) } }, CURRENT_RULE_OPTIONS],
      ['another rule set', input, RULE_OPTIONS_2_0_0],
    ]
    for (const [what, head, options] of asks) {
      // The stream gives no input for it (the caller reads the rows again), and the window's facts
      // made for the first ask do not answer it.
      expect(stream.inputAt(head, options), what).toBeUndefined()
      expect(() => evaluatePrepared({ ...streamed, tank: head.tank, thresholds: head.thresholds }, options), what).toThrow(BeyondWindow)
    }
  })
})
