/**
 * From what was typed for a tank event to what the database holds: an ammonia dose in
 * mg/L as N, a water change in litres, livestock as a count with its group.
 */
import { toNitrogen } from '../chemistry/nitrogen'
import { usGallonsToLitres, litresToUsGallons } from '../units'
import type { EventInput } from '../schemas/reading'
import type { LivestockGroup, UnitSystem } from '../vocabulary'
import { LIVESTOCK_GROUP_LABELS } from '../sign-off/plan'
import { checkTakenAt, type EntryIssue } from './entry'
import { toIsoInstant } from './fields'

export interface CanonicalEvent {
  at: string
  kind: EventInput['kind']
  amount: number | null
  group: LivestockGroup | null
  notes: string | null
}

export type EventResult = { ok: true, event: CanonicalEvent } | { ok: false, issues: EntryIssue[] }

/** Plain words for each kind of event. */
export const EVENT_LABELS: Readonly<Record<EventInput['kind'], string>> = Object.freeze({
  'ammonia-dose': 'Ammonia dose',
  'bacteria-dose': 'Bacteria dose',
  'water-change': 'Water change',
  'livestock-added': 'Livestock added',
  'lighting-change': 'Lighting change',
  'note': 'Note',
})

/** A dose above this (mg/L as N, about 25 ppm NH3) is not a cycling dose but a typing mistake. */
export const MAX_DOSE_N = 20
export const MAX_WATER_CHANGE_LITRES = 100_000
export const MAX_LIVESTOCK_COUNT = 1000

/** Validates and converts one event; `now` bounds back-dating like readings. */
export function toCanonicalEvent(input: EventInput, now: Date = new Date()): EventResult {
  const issues: EntryIssue[] = []
  const timeIssue = checkTakenAt(input.at, now)
  if (timeIssue) issues.push({ field: 'at', message: timeIssue.message.replace('A test cannot be taken', 'An event cannot be') })
  let amount: number | null = null
  let group: LivestockGroup | null = null
  const typed = input.amount ?? null
  switch (input.kind) {
    case 'ammonia-dose':
      if (typed === null || typed <= 0) issues.push({ field: 'amount', message: 'Give the dose in mg/L.' })
      else {
        amount = input.doseBasis === 'N' ? typed : toNitrogen(typed, input.doseBasis)
        if (amount > MAX_DOSE_N) issues.push({ field: 'amount', message: 'That dose is far above any cycling dose. Check the number.' })
      }
      break
    case 'water-change':
      if (typed === null || typed <= 0) issues.push({ field: 'amount', message: 'Give the volume of water changed.' })
      else {
        amount = input.volumeUnit === 'usgal' ? usGallonsToLitres(typed) : typed
        if (amount > MAX_WATER_CHANGE_LITRES) issues.push({ field: 'amount', message: 'That volume is too large.' })
      }
      break
    case 'livestock-added':
      if (!input.group) issues.push({ field: 'group', message: 'Choose what went in.' })
      else group = input.group
      if (typed === null || !Number.isInteger(typed) || typed < 1 || typed > MAX_LIVESTOCK_COUNT) issues.push({ field: 'amount', message: `Give how many, a whole number from 1 to ${MAX_LIVESTOCK_COUNT}.` })
      else amount = typed
      break
    default:
      // Bacteria doses, lighting changes and notes carry no number the engine reads.
      amount = null
  }
  const notes = input.notes?.trim() ? input.notes.trim() : null
  if (input.kind === 'note' && !notes) issues.push({ field: 'notes', message: 'Write the note.' })
  if (issues.length) return { ok: false, issues }
  // checkTakenAt has read the time, so it names an instant.
  return { ok: true, event: { at: toIsoInstant(input.at)!, kind: input.kind, amount, group, notes } }
}

/**
 * A stored event's amount in the user's units, for display: the one home for these words (the
 * history page and the evidence page). Livestock names its group as the certificate's livestock
 * plan does (`LIVESTOCK_GROUP_LABELS`), never by the stored key.
 */
export function describeEventAmount(kind: string, amount: number | null, units: UnitSystem, group?: string | null): string {
  if (amount === null) return ''
  if (kind === 'ammonia-dose') return `${(Math.round(amount * 100) / 100)} mg/L as N`
  if (kind === 'water-change') return units === 'us' ? `${Math.round(litresToUsGallons(amount) * 10) / 10} gal` : `${Math.round(amount * 10) / 10} L`
  if (kind === 'livestock-added') {
    const animals = `${amount} animal${amount === 1 ? '' : 's'}`
    const label = group ? (LIVESTOCK_GROUP_LABELS as Record<string, string>)[group] : undefined
    return label ? `${animals} (${label})` : animals
  }
  return String(amount)
}
