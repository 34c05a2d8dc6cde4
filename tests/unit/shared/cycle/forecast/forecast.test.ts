import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../../shared/cycle/engine'
import { DEFAULT_THRESHOLDS } from '../../../../../shared/cycle/thresholds'
import { explainForecast, FORECAST_CAVEAT, FORECAST_VERSION, forecastCycle, type CycleForecast } from '../../../../../shared/cycle/forecast'
import { fishInWithSpike, nitriteStall, textbookFishless } from '../scenarios'
import { TankLog } from '../tank-log'
import { FISH_IN, SLOW, syntheticTank, TEXTBOOK, type CurveShape } from './synthetic'

const DAY = 86_400_000
const day = (iso: string) => iso.slice(0, 10)
const width = (f: CycleForecast) => (Date.parse(f.completion!.to) - Date.parse(f.completion!.from)) / DAY

/** Whether the day the engine proved the cycle lies inside the forecast's dates (both ends included). */
function holds(f: CycleForecast, completedOn: string): boolean {
  return day(f.completion!.from) <= day(completedOn) && day(completedOn) <= day(f.completion!.to)
}

/** When the engine first proved the cycle, run right after each test as the server does; null when it never did. */
function realCompletion(log: TankLog): { completedOn: string, provenAt: string } | null {
  const input = log.input(0)
  for (const at of [...new Set(log.readings.map(r => r.takenAt))].sort()) {
    const provenAt = new Date(Date.parse(at) + 60_000).toISOString()
    const completedOn = evaluateCycle({ ...input, now: provenAt }).completedOn
    if (completedOn !== null) return { completedOn, provenAt }
  }
  return null
}

/** Every daily cut of a tank's history that got a range, with the engine's completion on the whole history. */
function cuts(log: TankLog, lastDay: number) {
  const completedOn = realCompletion(log)?.completedOn ?? null
  const forecasts: Array<{ day: number, f: CycleForecast }> = []
  for (let d = 1; d <= lastDay; d += 1) {
    const f = forecastCycle(log.input(d))
    if (f.status === 'forecast') forecasts.push({ day: d, f })
  }
  return { completedOn, forecasts }
}

function hitRate(shape: CurveShape, seeds: number): { hits: number, total: number } {
  let hits = 0
  let total = 0
  for (let seed = 1; seed <= seeds; seed += 1) {
    const { completedOn, forecasts } = cuts(syntheticTank(shape, seed), shape.lastDay)
    expect(completedOn, `seed ${seed} completes`).not.toBeNull()
    for (const { f } of forecasts) {
      total += 1
      if (holds(f, completedOn!)) hits += 1
    }
  }
  return { hits, total }
}

describe('completion forecast on the textbook fishless cycle', () => {
  const log = textbookFishless()

  it('says not enough data before the nitrite stage and while nitrite still rises', () => {
    for (const d of [1, 2, 3, 4]) expect(forecastCycle(log.input(d)).status, `day ${d}`).toBe('not-enough-data')
    expect(forecastCycle(log.input(3)).gap).toBe('sparse')
    expect(forecastCycle(log.input(8)).gap).toBe('rising')
  })

  it('gives a range once nitrite has fallen for a few tests, and the range narrows as tests arrive', () => {
    const { completedOn, forecasts } = cuts(log, 22)
    expect(completedOn).not.toBeNull()
    expect(forecasts.length).toBeGreaterThanOrEqual(4)
    const widths = forecasts.map(x => width(x.f))
    expect(widths[widths.length - 1]!).toBeLessThan(widths[0]!)
    // The last two days before the proof know it to within a day or two, and hold it.
    for (const { f } of forecasts.slice(-2)) expect(holds(f, completedOn!)).toBe(true)
  })

  it('turns into the verdict once the engine proves the cycle', () => {
    const proven = { ...log.input(0), now: realCompletion(log)!.provenAt }
    const f = forecastCycle(proven)
    const verdict = evaluateCycle(proven)
    expect(f.status).toBe('complete')
    expect(f.completion).toEqual({ from: verdict.completedOn, to: verdict.completedOn })
    expect(f.groups['lps-coral']!.from).toBe(verdict.readiness['lps-coral'].earliest)
  })

  it('moves each livestock group by the engine\'s own wait after completion', () => {
    const f = forecastCycle(log.input(17))
    expect(f.status).toBe('forecast')
    const lpsWait = DEFAULT_THRESHOLDS.lpsCoralDelayDays * DAY
    expect(Date.parse(f.groups['lps-coral']!.from) - Date.parse(f.completion!.from)).toBe(lpsWait)
    expect(Date.parse(f.groups['lps-coral']!.to) - Date.parse(f.completion!.to)).toBe(lpsWait)
    expect(f.groups.fish).toEqual(f.completion)
  })

  it('follows a company\'s longer proof: a longer zero run moves the range later', () => {
    const input = log.input(17)
    const standard = forecastCycle(input)
    const stricter = forecastCycle({ ...input, thresholds: { stableSpanHours: DEFAULT_THRESHOLDS.stableSpanHours + 72, stableMinTests: DEFAULT_THRESHOLDS.stableMinTests + 3 } })
    expect(stricter.status).toBe('forecast')
    expect(Date.parse(stricter.completion!.from)).toBeGreaterThan(Date.parse(standard.completion!.from))
    expect(Date.parse(stricter.completion!.to)).toBeGreaterThan(Date.parse(standard.completion!.to))
  })

  it('explains its basis in plain words and never calls itself a promise', () => {
    const f = forecastCycle(log.input(16))
    const words = explainForecast(f, iso => iso.slice(5, 10))
    expect(words).toMatch(/Nitrite has halved about every \d+ days? since 03-1\d \(\d+ tests\)/)
    expect(words).toContain('It assumes a test about every 24 hours')
    expect(FORECAST_CAVEAT).toContain('not a promise')
    expect(f.forecastVersion).toBe(FORECAST_VERSION)
  })

  it('is deterministic and ignores the order tests were given in', () => {
    const input = log.input(16)
    const shuffled = { ...input, readings: [...input.readings].reverse(), events: [...(input.events ?? [])].reverse() }
    expect(forecastCycle(shuffled)).toEqual(forecastCycle(input))
  })

  it('ignores records after its own moment', () => {
    // log.input(d) holds the whole log; what lies after `now` must change nothing.
    const input = log.input(16)
    const cut = { ...input, readings: input.readings.filter(r => r.takenAt <= input.now), events: (input.events ?? []).filter(e => e.at <= input.now) }
    expect(forecastCycle(input)).toEqual(forecastCycle(cut))
  })
})

describe('not enough data', () => {
  it('with three tests', () => {
    const log = new TankLog('fishless').days(1, { ammonia: [1.6, 1.2, 0.6], nitrite: [0.3, 0.9, 1.2] })
    const f = forecastCycle(log.input(3))
    expect(f).toMatchObject({ status: 'not-enough-data', gap: 'sparse', completion: null, likely: null })
    expect(explainForecast(f, iso => iso)).toMatch(/^Not enough data yet/)
  })

  it('for a stall, at every cut', () => {
    const log = nitriteStall(40)
    for (let d = 1; d <= 40; d += 1) expect(forecastCycle(log.input(d)).status, `day ${d}`).toBe('not-enough-data')
  })

  it('for an erratic curve', () => {
    const log = new TankLog('fishless').dose(0, 1.6).days(1, {
      ammonia: [1.6, 1.2, 0.6, 0.2, 0, 0, 0, 0, 0, 0, 0, 0, 0],
      nitrite: [0.1, 0.5, 1.0, 1.5, 0.2, 1.4, 0.1, 1.2, 0.15, 1.5, 0.1, 0.9, 0.2],
    })
    const f = forecastCycle(log.input(13))
    expect(f.status).toBe('not-enough-data')
    expect(f.gap).toBe('erratic')
  })

  it('for a curve that falls overall but scatters too widely around its line to read a pace from', () => {
    // Nitrite past its peak losing about a quarter a day, every test a factor of 2.2 off the line,
    // alternately high and low: the trend is clear, the pace is not (scatter over MAX_LOG_SCATTER).
    const falling = Array.from({ length: 11 }, (_, k) => Math.round(Math.exp(Math.log(3) - 0.3 * k + (k % 2 ? -0.8 : 0.8)) * 100) / 100)
    const log = new TankLog('fishless').dose(0, 1.6).days(1, {
      ammonia: [1.6, 1.2, 0.6, 0.2, ...falling.map(() => 0)],
      nitrite: [0.1, 0.8, 2.5, 4, ...falling],
      nitrate: [0, 0, 0.1, 0.2, ...falling.map((_, k) => 0.3 + 0.2 * k)],
    })
    const f = forecastCycle(log.input(4 + falling.length))
    expect(f).toMatchObject({ status: 'not-enough-data', gap: 'erratic', completion: null })
    expect(explainForecast(f, iso => iso)).toContain('the tests jump around too much')
  })

  it('when the tests stopped days ago', () => {
    const log = textbookFishless()
    const f = forecastCycle({ ...log.input(16), now: log.input(21).now, readings: log.input(16).readings.filter(r => r.takenAt <= log.input(16).now) })
    expect(f.gap).toBe('stale')
  })
})

describe('fish-in cycle', () => {
  it('forecasts from the nitrite fall after the water change and holds the completion near the end', () => {
    const { completedOn, forecasts } = cuts(fishInWithSpike(), 21)
    expect(completedOn).not.toBeNull()
    expect(forecasts.length).toBeGreaterThanOrEqual(3)
    for (const { f } of forecasts.slice(-2)) expect(holds(f, completedOn!)).toBe(true)
  })
})

describe('on families of synthetic tanks (seeded)', () => {
  // The 80 % range should hold the engine's own completion in most daily cuts.
  it.each([['textbook fishless', TEXTBOOK], ['slow cycle', SLOW], ['fish-in', FISH_IN]] as const)('%s: most ranges hold the real completion', (_name, shape) => {
    const { hits, total } = hitRate(shape, 8)
    expect(total).toBeGreaterThan(20)
    expect(hits / total).toBeGreaterThanOrEqual(0.7)
  })

  it('narrows as data arrives on a slow cycle', () => {
    const { forecasts } = cuts(syntheticTank(SLOW, 3), SLOW.lastDay)
    const first = forecasts[0]!
    const last = forecasts[forecasts.length - 1]!
    expect(width(last.f)).toBeLessThan(width(first.f))
  })
})
