/** Reads and writes a tank's readings and events, shaped for the API. Scoping is done by the caller (requireVisibleTank). */
import { and, eq, isNull } from 'drizzle-orm'
import type { EventListQuery, ReadingListQuery } from '#shared/schemas/reading'
import { flagsForValues } from '#shared/readings/entry'
import type { CorrectionTrail, EventList, EventView, ReadingList, ReadingView, Replacement } from '#shared/types/readings'
import { events, readings, uploads, users } from '#server/db/schema'
import { eventHistoryPage, readingHistoryPage } from '#server/domain/readings/current'
import type { Actor } from './access'
import { editRefusal, tankLockedUntil } from './entry-rules'

type ReadingRow = typeof readings.$inferSelect
type EventRow = typeof events.$inferSelect
/** What a reading's view is made from: a stored row (a page's row leaves out the tank and the import key). */
type ReadingViewRow = Omit<ReadingRow, 'tankId' | 'importKey'>
type EventViewRow = Omit<EventRow, 'tankId'>
/** A freshly written row has no replacement yet; a listed row says whether it has one. */
type Trail = { replacedBy?: Replacement | null }
type Tank = { id: string, organisationId: string }

/** The correction trail of a row: what it corrects and why, and what replaced it. */
function trailOf(row: { correctsId: string | null, correctionReason: string | null } & Trail): CorrectionTrail {
  const replacedBy = row.replacedBy ?? null
  return { current: !replacedBy, correctsId: row.correctsId, correctionReason: row.correctionReason, replacedBy }
}

/** A stored reading as the API shows it. */
export function toReadingView(row: ReadingViewRow & Trail, enteredByName: string | null, actor: Actor, tank: Tank, now = new Date(), locked: string | null = tankLockedUntil(tank.id)): ReadingView {
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
    ...trailOf(row),
    canEdit: !row.replacedBy && editRefusal(actor, tank, { enteredBy: row.enteredBy, createdAt: row.createdAt, at: row.takenAt }, now, locked) === null,
    flags: flagsForValues(values),
  }
}

/** A stored event as the API shows it. */
export function toEventView(row: EventViewRow & Trail, enteredByName: string | null, actor: Actor, tank: Tank, now = new Date(), locked: string | null = tankLockedUntil(tank.id)): EventView {
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
    ...trailOf(row),
    canEdit: !row.replacedBy && editRefusal(actor, tank, { enteredBy: row.enteredBy, createdAt: row.createdAt, at: row.at }, now, locked) === null,
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

/** One page of a tank's readings in a time range, replaced ones included with their trail. */
export function listReadings(actor: Actor, tank: Tank, query: ReadingListQuery): ReadingList {
  const { rows, total } = readingHistoryPage(useDB(), tank.id, query, { ...query, sort: READING_SORT[query.sort] })
  const now = new Date()
  const locked = tankLockedUntil(tank.id)
  // The page keeps what was typed as its stored text: parsed here, the one place that shows it.
  const items = rows.map(r => toReadingView({ ...r, entered: JSON.parse(r.entered) as ReadingRow['entered'] }, r.enteredByName, actor, tank, now, locked))
  return { items, total, page: query.page, pageSize: query.pageSize }
}

const EVENT_SORT = { at: events.at, kind: events.kind, createdAt: events.createdAt } as const

/** One page of a tank's events in a time range, replaced ones included with their trail. */
export function listEvents(actor: Actor, tank: Tank, query: EventListQuery): EventList {
  const { rows, total } = eventHistoryPage(useDB(), tank.id, query, { ...query, sort: EVENT_SORT[query.sort] })
  const now = new Date()
  const locked = tankLockedUntil(tank.id)
  return { items: rows.map(r => toEventView(r, r.enteredByName, actor, tank, now, locked)), total, page: query.page, pageSize: query.pageSize }
}

/** The reading row of this tank, or a 404. */
export function requireReading(tankId: string, readingId: string): ReadingRow {
  const row = useDB().select().from(readings).where(and(eq(readings.id, readingId), eq(readings.tankId, tankId))).get()
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Test not found' })
  return row
}

/** The event row of this tank, or a 404. */
export function requireEvent(tankId: string, eventId: string): EventRow {
  const row = useDB().select().from(events).where(and(eq(events.id, eventId), eq(events.tankId, tankId))).get()
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Event not found' })
  return row
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
