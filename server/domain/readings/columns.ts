/** The row columns a checked reading or event sets: one mapping for the routes, corrections and the demo seed. */
import type { CanonicalReading } from '../../../shared/readings/entry'
import type { CanonicalEvent } from '../../../shared/readings/events'

/** The columns a canonical reading sets. */
export function readingColumns(reading: CanonicalReading) {
  return { takenAt: reading.takenAt, ...reading.values, notes: reading.notes, entered: reading.entered }
}

/** The columns a canonical event sets. */
export function eventColumns(event: CanonicalEvent) {
  return { at: event.at, kind: event.kind, amount: event.amount, group: event.group, notes: event.notes }
}
