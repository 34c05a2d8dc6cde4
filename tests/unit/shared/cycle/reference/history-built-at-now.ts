/**
 * The history as the engine built it before it was prepared once and cut at `now`
 * (shared/cycle/history.ts at 3a2d147): every reading parsed, checked and sorted again at each
 * evaluation, what happened after `now` left out first. Kept unchanged as the test oracle for
 * `prepared-history.test.ts`. Never edit it to make a test pass.
 */

import type { History, TimedEvent, TimedReading } from '../../../../../shared/cycle/history'
import { parseTime } from '../../../../../shared/cycle/time'
import type { CycleEvent, CycleReading } from '../../../../../shared/cycle/types'

type NumericKey = Exclude<keyof TimedReading, 'id' | 't' | 'entered'>

const VALUE_KEYS: readonly NumericKey[] = [
  'ammoniaN', 'nitriteN', 'nitrateN', 'pH', 'temperatureC', 'salinity', 'alkalinityDkh', 'calciumMgL', 'magnesiumMgL', 'phosphateMgL',
]

// Temperature may legitimately be below zero on a broken heater's log; every other value may not.
function acceptable(key: NumericKey, value: number): boolean {
  return Number.isFinite(value) && (key === 'temperatureC' || value >= 0)
}

function compareStrings(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0
}

function valueKey(reading: TimedReading): string {
  return VALUE_KEYS.map(key => String(reading[key] ?? '')).join('|')
}

// Equal infinities subtract to NaN, which a sort would read as "unordered": compare explicitly.
function compareNumbers(a: number, b: number): number {
  return a < b ? -1 : a > b ? 1 : 0
}

/** History order of two readings. */
function compareReadings(a: TimedReading, b: TimedReading): number {
  return a.t - b.t || compareNumbers(a.entered, b.entered) || compareStrings(a.id, b.id) || compareStrings(valueKey(a), valueKey(b))
}

function compareEvents(a: TimedEvent, b: TimedEvent): number {
  return a.t - b.t
    || compareNumbers(a.entered, b.entered)
    || compareStrings(a.event.id, b.event.id)
    || compareStrings(a.event.kind, b.event.kind)
    || (a.event.amount ?? -1) - (b.event.amount ?? -1)
    || compareStrings(a.event.group ?? '', b.event.group ?? '')
}

/**
 * Values are compared with limits at a micro-unit (1e-6) precision: the same kit reading
 * typed in the form, imported from a CSV in another basis or entered as a correction
 * reaches the engine through different unit conversions, and must not fall on different
 * sides of a limit by a floating-point hair.
 */
function atLimitPrecision(value: number): number {
  return Math.round(value * 1e6) / 1e6
}

/** Entry time in epoch ms; a missing or unreadable one sorts first, as if entered before any other. */
function enteredTime(iso: string | undefined): number {
  const ms = iso === undefined ? Number.NaN : parseTime(iso)
  return Number.isFinite(ms) ? ms : Number.NEGATIVE_INFINITY
}

function sanitize(raw: CycleReading, t: number): { reading: TimedReading, repaired: boolean } {
  const values: Partial<Record<NumericKey, number>> = {}
  let repaired = false
  for (const key of VALUE_KEYS) {
    const value = raw[key]
    if (value === undefined || value === null) continue
    if (acceptable(key, value)) values[key] = atLimitPrecision(value)
    else repaired = true
  }
  return { reading: { id: raw.id, t, entered: enteredTime(raw.enteredAt), ...values }, repaired }
}

/** Builds the ordered history from raw input, dropping what happened after `nowMs`. */
export function buildHistory(readings: readonly CycleReading[], events: readonly CycleEvent[], nowMs: number): History {
  const kept: TimedReading[] = []
  const ignored: string[] = []
  const repaired: string[] = []
  for (const raw of readings) {
    const t = parseTime(raw.takenAt)
    if (!Number.isFinite(t)) {
      ignored.push(raw.id)
      continue
    }
    // A reading after `now` is in the verdict's future: leaving it out keeps old verdicts reproducible.
    if (t > nowMs) continue
    const result = sanitize(raw, t)
    kept.push(result.reading)
    if (result.repaired) repaired.push(raw.id)
  }
  const timedEvents: TimedEvent[] = []
  for (const event of events) {
    const t = parseTime(event.at)
    if (Number.isFinite(t) && t <= nowMs) timedEvents.push({ event, t, entered: enteredTime(event.enteredAt) })
  }
  return {
    readings: kept.sort(compareReadings),
    events: timedEvents.sort(compareEvents),
    ignoredReadingIds: ignored.sort(compareStrings),
    repairedReadingIds: repaired.sort(compareStrings),
  }
}
