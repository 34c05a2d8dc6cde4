import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../shared/cycle/engine'
import { RULES } from '../../../../shared/cycle/registry'
import { DEFAULT_THRESHOLDS } from '../../../../shared/cycle/thresholds'
import { LIVESTOCK_GROUPS, type CycleInput, type CycleReading, type Thresholds, type Verdict } from '../../../../shared/cycle/types'
import { historyArb, shuffled, tankArb, toInput } from './arbitraries'
import { at } from './tank-log'

const RUNS = { seed: 20261201, numRuns: 300 }
// Generous per-test limit: a busy machine must not turn a slow run into a failure (nothing here is timed).
const LIMIT_MS = 60_000

/** The latest reading carrying `key`, ordered as the contract says: by takenAt, then entry time, then id. */
function latestWith(input: CycleInput, key: 'ammoniaN' | 'nitriteN'): CycleReading | undefined {
  const now = Date.parse(input.now)
  const entered = (r: CycleReading) => (r.enteredAt === undefined ? Number.NEGATIVE_INFINITY : Date.parse(r.enteredAt))
  return input.readings
    .filter(r => r[key] !== undefined && Date.parse(r.takenAt) <= now)
    .sort((a, b) => Date.parse(a.takenAt) - Date.parse(b.takenAt) || (entered(a) < entered(b) ? -1 : entered(a) > entered(b) ? 1 : 0) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0))
    .at(-1)
}

function time(iso: string | null): number {
  return iso === null ? Number.NaN : Date.parse(iso)
}

describe('cycle engine properties', { timeout: LIMIT_MS }, () => {
  it('does not depend on the order of readings and events, same-minute ties included', () => {
    fc.assert(fc.property(historyArb, fc.integer(), (knobs, seed) => {
      const input = toInput(knobs)
      const reordered = { ...input, readings: shuffled(input.readings, seed), events: shuffled(input.events ?? [], seed + 1) }
      expect(evaluateCycle(reordered)).toEqual(evaluateCycle(input))
    }), RUNS)
  })

  it('is deterministic and leaves its input untouched', () => {
    fc.assert(fc.property(historyArb, (knobs) => {
      const input = toInput(knobs)
      const copy = structuredClone(input)
      const first = JSON.stringify(evaluateCycle(input))
      expect(JSON.stringify(evaluateCycle(input))).toBe(first)
      expect(input).toEqual(copy)
    }), { ...RUNS, numRuns: 100 })
  })

  it('never claims completion while the latest ammonia or nitrite is above its limit', () => {
    let completions = 0
    fc.assert(fc.property(tankArb, (knobs) => {
      const input = toInput(knobs)
      const v = evaluateCycle(input)
      if (v.phase !== 'complete') {
        expect(v.completedOn).toBeNull()
        return
      }
      completions += 1
      expect(latestWith(input, 'ammoniaN')?.ammoniaN ?? 0).toBeLessThanOrEqual(DEFAULT_THRESHOLDS.ammoniaZeroN)
      expect(latestWith(input, 'nitriteN')?.nitriteN ?? 0).toBeLessThanOrEqual(DEFAULT_THRESHOLDS.nitriteZeroN)
      expect(time(v.completedOn)).toBeLessThanOrEqual(time(input.now))
      // completedOn is the time of a zero test that is in the input.
      const proving = input.readings.filter(r => Date.parse(r.takenAt) === time(v.completedOn))
      expect(proving.some(r => (r.ammoniaN ?? 1) <= DEFAULT_THRESHOLDS.ammoniaZeroN && (r.nitriteN ?? 1) <= DEFAULT_THRESHOLDS.nitriteZeroN)).toBe(true)
    }), RUNS)
    // The generator must reach completed tanks, or this property would hold vacuously.
    expect(completions).toBeGreaterThan(20)
  })

  it('never completes a tank whose tests never rose and whose nitrate never moved', () => {
    fc.assert(fc.property(historyArb, (knobs) => {
      const input = toInput(knobs)
      const flat = { ...input, readings: input.readings.map(r => ({ ...r, ...(r.ammoniaN === undefined ? {} : { ammoniaN: Math.min(r.ammoniaN, 0.05) }), ...(r.nitriteN === undefined ? {} : { nitriteN: Math.min(r.nitriteN, 0.05) }), ...(r.nitrateN === undefined ? {} : { nitrateN: 2 }) })) }
      expect(evaluateCycle(flat).phase).not.toBe('complete')
    }), RUNS)
  })

  it('never lets stony corals in before fish, whatever the delays', () => {
    let stonyAllowed = 0
    const delays = fc.record({
      softCoralDelayDays: fc.constantFrom(0, 5, 40),
      lpsCoralDelayDays: fc.constantFrom(0, 3, 30),
      spsCoralDelayDays: fc.constantFrom(0, 10, 60),
    })
    fc.assert(fc.property(tankArb, delays, (knobs, overrides) => {
      const v: Verdict = evaluateCycle(toInput(knobs, overrides))
      const fish = v.readiness.fish
      for (const group of ['lps-coral', 'sps-coral'] as const) {
        const stony = v.readiness[group]
        if (stony.allowed) {
          stonyAllowed += 1
          expect(fish.allowed).toBe(true)
        }
        if (stony.earliest !== null) {
          expect(fish.earliest).not.toBeNull()
          expect(time(stony.earliest)).toBeGreaterThanOrEqual(time(fish.earliest))
        }
      }
    }), RUNS)
    expect(stonyAllowed).toBeGreaterThan(0)
  })

  it('never makes a tank more complete with stricter thresholds', () => {
    let strictCompletions = 0
    const tighten = fc.record({
      ammoniaZeroN: fc.constantFrom(0.05, 0.02, 0),
      nitriteZeroN: fc.constantFrom(0.05, 0.02, 0),
      nitriteTraceN: fc.constantFrom(0.076, 0.05, 0),
      nitratePresentN: fc.constantFrom(0.5, 1, 2),
      riseN: fc.constantFrom(0.2, 0.5, 1),
      stableSpanHours: fc.constantFrom(48, 72, 120),
      stableMinTests: fc.constantFrom(3, 4, 6),
      zeroRunMaxGapHours: fc.constantFrom(72, 48, 30),
      clearanceWindowHours: fc.constantFrom(30, 24, 12),
      clearanceMinDoseN: fc.constantFrom(0.8, 1.2, 2),
      clearanceDays: fc.constantFrom(3, 4),
      doseArrivalFraction: fc.constantFrom(0.25, 0.5, 0.9),
      nitrateRiseN: fc.constantFrom(1, 1.5, 3),
      fishInStableDays: fc.constantFrom(7, 9),
      seededNitrateRiseDays: fc.constantFrom(14, 20),
    })
    const loosen: Partial<Thresholds> = {
      ammoniaZeroN: 0.1, nitriteZeroN: 0.1, nitriteTraceN: 0.15, nitratePresentN: 0.2, riseN: 0.1, stableSpanHours: 24, stableMinTests: 2,
      zeroRunMaxGapHours: 96, clearanceWindowHours: 36, clearanceMinDoseN: 0.3,
      clearanceDays: 1, doseArrivalFraction: 0.1, nitrateRiseN: 0.5, fishInStableDays: 3, seededNitrateRiseDays: 7,
    }
    fc.assert(fc.property(tankArb, tighten, (knobs, strict) => {
      const lenient = evaluateCycle(toInput(knobs, loosen))
      const base = evaluateCycle(toInput(knobs))
      const stricter = evaluateCycle(toInput(knobs, strict))
      // Each step (lenient -> defaults -> stricter) may only delay or withhold completion.
      for (const [loose, tight] of [[lenient, base], [base, stricter]] as const) {
        if (tight.completedOn === null) continue
        expect(loose.completedOn).not.toBeNull()
        expect(time(loose.completedOn)).toBeLessThanOrEqual(time(tight.completedOn))
      }
      if (stricter.completedOn !== null) strictCompletions += 1
    }), RUNS)
    expect(strictCompletions).toBeGreaterThan(5)
  })

  it('never throws on odd input, and always answers for every group', () => {
    const value = fc.option(fc.oneof(fc.double({ min: -5, max: 60 }), fc.constantFrom(Number.NaN, Infinity, 0, 1e6)), { nil: undefined })
    const when = fc.oneof(fc.integer({ min: -5, max: 80 }).map(d => at(d, d % 24 < 0 ? 0 : d % 24)), fc.constantFrom('', 'garbage', '2026-13-45'))
    const readingArb = fc.record({
      id: fc.string({ maxLength: 4 }), takenAt: when, ammoniaN: value, nitriteN: value, nitrateN: value,
      pH: value, temperatureC: value, salinity: value, alkalinityDkh: value, calciumMgL: value, magnesiumMgL: value,
    })
    const eventArb = fc.record({
      id: fc.string({ maxLength: 4 }),
      at: when,
      kind: fc.constantFrom('ammonia-dose' as const, 'bacteria-dose' as const, 'water-change' as const, 'livestock-added' as const, 'note' as const),
      amount: value,
      group: fc.option(fc.constantFrom(...LIVESTOCK_GROUPS), { nil: undefined }),
    })
    fc.assert(fc.property(
      fc.array(readingArb, { maxLength: 40 }), fc.array(eventArb, { maxLength: 6 }), fc.constantFrom('fishless' as const, 'fish-in' as const), fc.integer({ min: 0, max: 90 }),
      (readings, events, cycleMethod, nowDay) => {
        const v = evaluateCycle({ tank: { volumeLitres: 300, cycleMethod, startedAt: at(0, 8) }, readings, events, now: at(nowDay) })
        expect(Object.keys(v.readiness).sort()).toEqual([...LIVESTOCK_GROUPS].sort())
        for (const action of v.actions) {
          if (action.waterChangePercent !== undefined) expect(action.waterChangePercent).toBeGreaterThanOrEqual(0)
          if (action.waterChangePercent !== undefined) expect(action.waterChangePercent).toBeLessThanOrEqual(100)
        }
      },
    ), RUNS)
  })

  it('only reports rules the registry lists, each finding naming the readings it rests on', () => {
    const ids = new Set(RULES.map(r => r.id))
    fc.assert(fc.property(historyArb, (knobs) => {
      const input = toInput(knobs)
      const readingIds = new Set(input.readings.map(r => r.id))
      const findings = evaluateCycle(input).findings
      const rank = { danger: 0, caution: 1, info: 2 }
      // Most severe first, so a client reads the danger before the explanations.
      expect(findings.map(f => rank[f.severity])).toEqual(findings.map(f => rank[f.severity]).sort((a, b) => a - b))
      for (const f of findings) {
        expect(ids.has(f.ruleId)).toBe(true)
        for (const id of f.readingIds) expect(readingIds.has(id)).toBe(true)
      }
    }), RUNS)
  })
})
