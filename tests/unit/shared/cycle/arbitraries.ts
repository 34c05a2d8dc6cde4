/**
 * fast-check generators of plausible tank histories: a noisy cycle curve with
 * skipped days, missing values, doses, water changes and livestock, so that the
 * properties meet tanks that complete as well as tanks that never do.
 */

import fc from 'fast-check'
import { LIVESTOCK_GROUPS, type CycleEvent, type CycleInput, type CycleReading, type Thresholds } from '../../../../shared/cycle/types'
import { at } from './tank-log'

const DAYS = 40

/** Mostly `common`, sometimes one of `rare`: real logs are mostly ordinary days. */
function mostly<T>(common: T, ...rare: T[]): fc.Arbitrary<T> {
  return fc.oneof({ weight: 12, arbitrary: fc.constant(common) }, { weight: 1, arbitrary: fc.constantFrom(...rare) })
}

const dayArb = fc.record({
  skip: fc.integer({ min: 0, max: 9 }),
  hour: fc.integer({ min: 6, max: 21 }),
  jitterA: mostly(0, 0.03, 0.1, 0.6),
  jitterN: mostly(0, 0.04, 0.07, 0.2, 1.2),
  missing: mostly('none', 'ammonia', 'nitrite', 'nitrate'),
  pH: fc.constantFrom(undefined, 7.6, 8.1, 8.3),
  temperatureC: mostly(25, undefined, 21, 30),
  salinity: mostly(0, -0.6, 0.4, -5, 4),
})

const eventArb = fc.record({ day: fc.integer({ min: 0, max: DAYS }), hour: fc.integer({ min: 0, max: 23 }) })

/** The knobs of one generated history. */
export const historyArb = fc.record({
  method: fc.constantFrom('fishless' as const, 'fish-in' as const),
  ammoniaEnd: fc.integer({ min: 1, max: 15 }),
  nitriteLag: fc.integer({ min: 0, max: 12 }),
  peakA: fc.constantFrom(0.1, 0.4, 1.0, 1.6, 3),
  peakN: fc.constantFrom(0.1, 0.6, 1.5, 3),
  nitrateMax: fc.constantFrom(0, 0.3, 2, 5, 5),
  salinity: fc.constantFrom(34, 34, 35, 29),
  days: fc.array(dayArb, { minLength: DAYS, maxLength: DAYS }),
  clearanceAfter: fc.option(fc.integer({ min: 0, max: 6 }), { freq: 4 }),
  /** Days of proof doses from `clearanceAfter` (one a day), as rule set 2 asks. */
  clearanceDays: fc.constantFrom(1, 3, 3, 4),
  /** Hours after each proof dose of an extra test that shows it arrived (as careful clients do). */
  clearanceCheck: fc.option(fc.record({ hours: fc.integer({ min: 1, max: 34 }), ammoniaN: fc.constantFrom(0.08, 0.5, 1.6), nitriteN: fc.constantFrom(0, 0.1) }), { freq: 4 }),
  /** Reef chemistry tested, so stony corals can be judged. */
  reefChemistry: fc.boolean(),
  /** A second test taken the same minute as one day's test, entered later with other values. */
  tie: fc.option(fc.record({ day: fc.integer({ min: 1, max: DAYS }), ammoniaN: fc.constantFrom(0, 0.5, 2), nitriteN: fc.constantFrom(0, 1) }), { freq: 2 }),
  doses: fc.array(fc.record({ when: eventArb, amount: fc.constantFrom(undefined, 0.4, 1.6) }), { maxLength: 3 }),
  waterChanges: fc.array(eventArb, { maxLength: 2 }),
  livestock: fc.array(fc.record({ when: eventArb, group: fc.constantFrom(...LIVESTOCK_GROUPS), count: fc.constantFrom(1, 2, 6) }), { maxLength: 2 }),
  bacteria: fc.boolean(),
  nowDay: fc.integer({ min: 3, max: DAYS + 10 }),
  nowHour: fc.integer({ min: 0, max: 23 }),
})

/** One generated history's knobs. */
export type HistoryKnobs = typeof historyArb extends fc.Arbitrary<infer T> ? T : never

function round(value: number): number {
  return Math.round(value * 100) / 100
}

function curve(k: HistoryKnobs, day: number): { ammoniaN: number, nitriteN: number, nitrateN: number } {
  const ammoniaN = day < k.ammoniaEnd ? k.peakA * (1 - day / k.ammoniaEnd) : 0
  const nitriteStart = k.ammoniaEnd / 2
  const nitriteEnd = k.ammoniaEnd + k.nitriteLag
  const middle = (nitriteStart + nitriteEnd) / 2
  const half = Math.max(1, (nitriteEnd - nitriteStart) / 2)
  const nitriteN = day > nitriteStart && day < nitriteEnd ? k.peakN * Math.max(0, 1 - Math.abs(day - middle) / half) : 0
  const nitrateN = k.nitrateMax * Math.min(1, day / Math.max(1, nitriteEnd))
  return { ammoniaN: round(ammoniaN), nitriteN: round(nitriteN), nitrateN: round(nitrateN) }
}

function reading(k: HistoryKnobs, day: number): CycleReading | null {
  const d = k.days[day - 1]
  if (d === undefined || d.skip === 0) return null
  const base = curve(k, day)
  const r: CycleReading = { id: `r${String(day).padStart(2, '0')}`, takenAt: at(day, d.hour) }
  if (d.missing !== 'ammonia') r.ammoniaN = round(base.ammoniaN + d.jitterA)
  if (d.missing !== 'nitrite') r.nitriteN = round(base.nitriteN + d.jitterN)
  if (d.missing !== 'nitrate') r.nitrateN = base.nitrateN
  if (d.pH !== undefined) r.pH = d.pH
  if (d.temperatureC !== undefined) r.temperatureC = d.temperatureC
  r.salinity = k.salinity + d.salinity
  if (k.reefChemistry) Object.assign(r, { alkalinityDkh: 8.5, calciumMgL: 420, magnesiumMgL: 1320, phosphateMgL: 0.03 })
  // Entered a few minutes after it was taken, as clients do.
  r.enteredAt = at(day, d.hour + 0.1)
  return r
}

function events(k: HistoryKnobs): CycleEvent[] {
  const list: CycleEvent[] = [{ id: 'e-start', at: at(0, 10), kind: 'ammonia-dose', amount: 1.6 }]
  if (k.bacteria) list.push({ id: 'e-bact', at: at(0, 11), kind: 'bacteria-dose' })
  if (k.clearanceAfter !== null) {
    for (let i = 0; i < k.clearanceDays; i += 1) {
      list.push({ id: `e-clear${i}`, at: at(k.ammoniaEnd + k.nitriteLag + k.clearanceAfter + i, 10), kind: 'ammonia-dose', amount: 1.6 })
    }
  }
  k.doses.forEach((d, i) => list.push({ id: `e-dose${i}`, at: at(d.when.day, d.when.hour), kind: 'ammonia-dose', ...(d.amount === undefined ? {} : { amount: d.amount }) }))
  k.waterChanges.forEach((w, i) => list.push({ id: `e-wc${i}`, at: at(w.day, w.hour), kind: 'water-change', amount: 60 }))
  k.livestock.forEach((l, i) => list.push({ id: `e-live${i}`, at: at(l.when.day, l.when.hour), kind: 'livestock-added', group: l.group, amount: l.count }))
  return list
}

/** The engine input for one generated history. */
export function toInput(k: HistoryKnobs, thresholds?: Partial<Thresholds>): CycleInput {
  const readings: CycleReading[] = []
  for (let day = 1; day <= DAYS; day += 1) {
    const r = reading(k, day)
    if (r) readings.push(r)
  }
  if (k.clearanceAfter !== null && k.clearanceCheck !== null) {
    const check = k.clearanceCheck
    for (let i = 0; i < k.clearanceDays; i += 1) {
      const day = k.ammoniaEnd + k.nitriteLag + k.clearanceAfter + i
      readings.push({ id: `r-check${i}`, takenAt: at(day, 10 + check.hours), ammoniaN: check.ammoniaN, nitriteN: check.nitriteN, nitrateN: k.nitrateMax })
    }
  }
  const tied = k.tie === null ? undefined : readings.find(r => r.id === `r${String(k.tie?.day).padStart(2, '0')}`)
  if (k.tie !== null && tied !== undefined) {
    // Same minute, entered later: the engine must read it as the latest of the two whatever the input order.
    readings.push({ id: 'r-tie', takenAt: tied.takenAt, enteredAt: at(k.tie.day, 23), ammoniaN: k.tie.ammoniaN, nitriteN: k.tie.nitriteN })
  }
  return {
    tank: { volumeLitres: 300, cycleMethod: k.method, startedAt: at(0, 8) },
    readings,
    events: events(k),
    ...(thresholds ? { thresholds } : {}),
    now: at(k.nowDay, k.nowHour),
  }
}

/** A seeded Fisher-Yates shuffle, so a failing order can be replayed. */
export function shuffled<T>(items: readonly T[], seed: number): T[] {
  const out = [...items]
  let state = seed >>> 0 || 1
  for (let i = out.length - 1; i > 0; i -= 1) {
    // xorshift32: plenty for reordering test data.
    state ^= state << 13
    state ^= state >>> 17
    state ^= state << 5
    const j = (state >>> 0) % (i + 1)
    const a = out[i] as T
    out[i] = out[j] as T
    out[j] = a
  }
  return out
}

/**
 * A careful reef keeper's version of a history: proof doses on consecutive days, each tested
 * a few hours later to show it arrived; salinity steady at 35, pH 8.1, reef chemistry and
 * phosphate tested and in range, nitrate kept under the stony-coral limit. Without it few
 * generated tanks complete and almost none reaches stony corals, so a property about them
 * would hold only because nothing was allowed.
 */
export const reefReadyArb: fc.Arbitrary<HistoryKnobs> = historyArb.map(k => ({
  ...k,
  salinity: 35,
  nitrateMax: 2,
  reefChemistry: true,
  clearanceAfter: k.clearanceAfter ?? 1,
  clearanceDays: k.clearanceDays === 1 ? 3 : k.clearanceDays,
  clearanceCheck: { hours: 4, ammoniaN: 1.6, nitriteN: 0 },
  days: k.days.map(d => ({ ...d, pH: 8.1 as const, temperatureC: 25, salinity: 0 })),
}))

/** Any history, and as often a careful keeper's, so properties about complete tanks meet many. */
export const tankArb: fc.Arbitrary<HistoryKnobs> = fc.oneof(historyArb, reefReadyArb)
