/** Reads and writes a tank's readings and events, shaped for the API. Scoping is done by the caller (requireVisibleTank). */
import { and, asc, desc, eq, gte, isNull, lte, sql, type SQL } from 'drizzle-orm'
import type { EventListQuery, ReadingListQuery } from '#shared/schemas/reading'
import type { CanonicalReading } from '#shared/readings/entry'
import { flagsForValues } from '#shared/readings/entry'
import type { CanonicalEvent } from '#shared/readings/events'
import type { EventList, EventView, ReadingList, ReadingView } from '#shared/types/readings'
import { events, readings, uploads, users } from '../db/schema'
import type { Actor } from './access'
import { editRefusal, tankLockedUntil } from './entry-rules'

type ReadingRow = typeof readings.$inferSelect
type EventRow = typeof events.$inferSelect
type Tank = { id: string, organisationId: string }

/** A stored reading as the API shows it. */
export function toReadingView(row: ReadingRow, enteredByName: string | null, actor: Actor, tank: Tank, now = new Date(), locked: string | null = tankLockedUntil(tank.id)): ReadingView {
  const values = {
    ammoniaN: row.ammoniaN, nitriteN: row.nitriteN, nitrateN: row.nitrateN, pH: row.pH, temperatureC: row.temperatureC,
    salinity: row.salinity, alkalinityDkh: row.alkalinityDkh, calciumMgL: row.calciumMgL, magnesiumMgL: row.magnesiumMgL, phosphateMgL: row.phosphateMgL,
  }
  return {
    id: row.id,
    takenAt: row.takenAt,
    ...values,
    notes: row.notes,
    entered: row.entered ?? {},
    enteredBy: row.enteredBy,
    enteredByName,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
    canEdit: editRefusal(actor, tank, { enteredBy: row.enteredBy, createdAt: row.createdAt, at: row.takenAt }, now, locked) === null,
    flags: flagsForValues(values),
  }
}

/** A stored event as the API shows it. */
export function toEventView(row: EventRow, enteredByName: string | null, actor: Actor, tank: Tank, now = new Date(), locked: string | null = tankLockedUntil(tank.id)): EventView {
  return {
    id: row.id,
    at: row.at,
    kind: row.kind,
    amount: row.amount,
    group: row.group,
    notes: row.notes,
    enteredBy: row.enteredBy,
    enteredByName,
    createdAt: row.createdAt,
    canEdit: editRefusal(actor, tank, { enteredBy: row.enteredBy, createdAt: row.createdAt, at: row.at }, now, locked) === null,
  }
}

const READING_SORT = {
  takenAt: readings.takenAt,
  ammoniaN: readings.ammoniaN,
  nitriteN: readings.nitriteN,
  nitrateN: readings.nitrateN,
  pH: readings.pH,
  temperatureC: readings.temperatureC,
  salinity: readings.salinity,
  createdAt: readings.createdAt,
} as const

/** One page of a tank's readings in a time range. */
export function listReadings(actor: Actor, tank: Tank, query: ReadingListQuery): ReadingList {
  const conditions: SQL[] = [eq(readings.tankId, tank.id)]
  if (query.from) conditions.push(gte(readings.takenAt, new Date(query.from).toISOString()))
  if (query.to) conditions.push(lte(readings.takenAt, new Date(query.to).toISOString()))
  const where = and(...conditions)
  const column = READING_SORT[query.sort]
  const rows = useDB().select({ reading: readings, name: users.name }).from(readings)
    .leftJoin(users, eq(users.id, readings.enteredBy))
    .where(where)
    .orderBy(query.dir === 'asc' ? asc(column) : desc(column), query.dir === 'asc' ? asc(readings.id) : desc(readings.id))
    .limit(query.pageSize).offset((query.page - 1) * query.pageSize).all()
  const total = useDB().select({ n: sql<number>`count(*)` }).from(readings).where(where).get()?.n ?? 0
  const now = new Date()
  const locked = tankLockedUntil(tank.id)
  return { items: rows.map(r => toReadingView(r.reading, r.name, actor, tank, now, locked)), total, page: query.page, pageSize: query.pageSize }
}

const EVENT_SORT = { at: events.at, kind: events.kind, createdAt: events.createdAt } as const

/** One page of a tank's events in a time range. */
export function listEvents(actor: Actor, tank: Tank, query: EventListQuery): EventList {
  const conditions: SQL[] = [eq(events.tankId, tank.id)]
  if (query.from) conditions.push(gte(events.at, new Date(query.from).toISOString()))
  if (query.to) conditions.push(lte(events.at, new Date(query.to).toISOString()))
  const where = and(...conditions)
  const column = EVENT_SORT[query.sort]
  const rows = useDB().select({ event: events, name: users.name }).from(events)
    .leftJoin(users, eq(users.id, events.enteredBy))
    .where(where)
    .orderBy(query.dir === 'asc' ? asc(column) : desc(column), query.dir === 'asc' ? asc(events.id) : desc(events.id))
    .limit(query.pageSize).offset((query.page - 1) * query.pageSize).all()
  const total = useDB().select({ n: sql<number>`count(*)` }).from(events).where(where).get()?.n ?? 0
  const now = new Date()
  const locked = tankLockedUntil(tank.id)
  return { items: rows.map(r => toEventView(r.event, r.name, actor, tank, now, locked)), total, page: query.page, pageSize: query.pageSize }
}

/** The reading row of this tank, or a 404. */
export function requireReading(tankId: string, readingId: string): ReadingRow {
  const row = useDB().select().from(readings).where(and(eq(readings.id, readingId), eq(readings.tankId, tankId))).get()
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Reading not found' })
  return row
}

/** The event row of this tank, or a 404. */
export function requireEvent(tankId: string, eventId: string): EventRow {
  const row = useDB().select().from(events).where(and(eq(events.id, eventId), eq(events.tankId, tankId))).get()
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Event not found' })
  return row
}

/** The columns a canonical reading sets. */
export function readingColumns(reading: CanonicalReading) {
  return { takenAt: reading.takenAt, ...reading.values, notes: reading.notes, entered: reading.entered }
}

/** The columns a canonical event sets. */
export function eventColumns(event: CanonicalEvent) {
  return { at: event.at, kind: event.kind, amount: event.amount, group: event.group, notes: event.notes }
}

/**
 * Links a photo of the test to the reading. The photo itself is stored by the uploads
 * feature (server/utils/uploads.ts); this only records which reading it shows.
 */
export function attachTestPhoto(tank: Tank, readingId: string, uploadId: string): boolean {
  // Only a test photo not yet used: a stage's photo or another reading's stays where it is.
  const result = useDB().update(uploads).set({ readingId })
    .where(and(eq(uploads.id, uploadId), eq(uploads.tankId, tank.id), eq(uploads.organisationId, tank.organisationId), isNull(uploads.stageId), isNull(uploads.readingId))).run()
  return result.changes > 0
}

/** The name of a user, for a freshly written row. */
export function userName(userId: string): string | null {
  return useDB().select({ name: users.name }).from(users).where(eq(users.id, userId)).get()?.name ?? null
}
