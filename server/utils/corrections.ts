/**
 * Corrections: after sign-off a reading or event is never changed in place; a new row
 * points at the one it corrects, with a reason, and the engine uses the newest version
 * (server/db/verdicts.ts skips corrected rows). A correction, and the livestock written at
 * the start of stocking, pass the very field rules of the reading and event forms
 * (shared/readings/entry.ts, events.ts). Also the start of stocking.
 */
import { and, eq } from 'drizzle-orm'
import { checkCanonicalReading, type CanonicalValues } from '#shared/readings/entry'
import { toCanonicalEvent } from '#shared/readings/events'
import type { EventInput } from '#shared/schemas/reading'
import type { EventCorrectionInput, ReadingCorrectionInput, StartStockingInput } from '#shared/schemas/sign-off'
import { MEASURED_FIELDS } from '#shared/vocabulary'
import { eventColumns } from '#server/domain/readings/columns'
import type { tanks } from '#server/db/schema'
import { events, readings } from '#server/db/schema'
import { canManageTank, type Actor } from './access'
import { assertEntryUnlocked } from './sign-off-lock'

const READING_VALUE_KEYS = [...MEASURED_FIELDS, 'notes'] as const

function alreadyCorrected(kind: 'reading' | 'event', correctionId: string): never {
  throw createError({
    statusCode: 409,
    statusMessage: `This ${kind} has already been corrected; correct the latest correction instead`,
    data: { latestId: correctionId },
  })
}

/** Adds a correction of a reading of the tank; 404 if the reading is not the tank's. */
export async function correctReading(actor: Actor, tankId: string, readingId: string, input: ReadingCorrectionInput, now = new Date()) {
  const db = useDB()
  const original = db.select().from(readings).where(and(eq(readings.id, readingId), eq(readings.tankId, tankId))).get()
  if (!original) throw createError({ statusCode: 404, statusMessage: 'Test not found' })
  const correctedBy = () => db.select({ id: readings.id }).from(readings).where(eq(readings.correctsId, readingId)).get()
  const later = correctedBy()
  if (later) alreadyCorrected('reading', later.id)
  const values: Partial<typeof readings.$inferInsert> = {}
  for (const key of READING_VALUE_KEYS) {
    const given = input[key]
    ;(values as Record<string, unknown>)[key] = given === undefined ? original[key] : given
  }
  const issues = checkCanonicalReading(original.takenAt, values as CanonicalValues, values.notes ?? null, now)
  if (issues.length) fieldError(issues)
  const row = await writeTransaction(() => {
    // Asked again under the write lock: a correction saved while this one waited for it goes first.
    const first = correctedBy()
    if (first) alreadyCorrected('reading', first.id)
    const inserted = db.insert(readings).values({
      tankId,
      takenAt: original.takenAt,
      enteredBy: actor.id,
      ...values,
      entered: { correctionOf: original.id },
      correctsId: original.id,
      correctionReason: input.reason,
    }).returning().get()
    const changed = Object.fromEntries(READING_VALUE_KEYS.filter(k => input[k] !== undefined).map(k => [k, original[k]]))
    writeAudit(actor, { action: 'reading.correct', entity: 'reading', entityId: inserted.id, before: { readingId: original.id, ...changed }, after: { correctsId: original.id, reason: input.reason, ...Object.fromEntries(Object.keys(changed).map(k => [k, inserted[k as keyof typeof inserted]])) } })
    return inserted
  })
  await onTankDataChanged(tankId, { readingId: row.id, actor })
  return row
}

/** Adds a correction of an event of the tank; 404 if the event is not the tank's. */
export async function correctEvent(actor: Actor, tankId: string, eventId: string, input: EventCorrectionInput, now = new Date()) {
  const db = useDB()
  const original = db.select().from(events).where(and(eq(events.id, eventId), eq(events.tankId, tankId))).get()
  if (!original) throw createError({ statusCode: 404, statusMessage: 'Event not found' })
  const correctedBy = () => db.select({ id: events.id }).from(events).where(eq(events.correctsId, eventId)).get()
  const later = correctedBy()
  if (later) alreadyCorrected('event', later.id)
  // Amounts are canonical (mg/L as N, litres, a count), so the form's rules read them on that basis.
  const checked = toCanonicalEvent({
    at: original.at,
    kind: original.kind,
    amount: input.amount === undefined ? original.amount : input.amount,
    doseBasis: 'N',
    volumeUnit: 'L',
    group: (input.group === undefined ? original.group : input.group) as EventInput['group'],
    notes: input.notes === undefined ? original.notes : input.notes,
  }, now)
  if (!checked.ok) fieldError(checked.issues)
  const row = await writeTransaction(() => {
    // Asked again under the write lock: a correction saved while this one waited for it goes first.
    const first = correctedBy()
    if (first) alreadyCorrected('event', first.id)
    const inserted = db.insert(events).values({
      tankId,
      at: original.at,
      kind: original.kind,
      amount: checked.event.amount,
      group: checked.event.group,
      notes: checked.event.notes,
      enteredBy: actor.id,
      correctsId: original.id,
      correctionReason: input.reason,
    }).returning().get()
    writeAudit(actor, { action: 'event.correct', entity: 'event', entityId: inserted.id, before: { eventId: original.id, amount: original.amount, group: original.group, notes: original.notes }, after: { correctsId: original.id, reason: input.reason, amount: inserted.amount, group: inserted.group, notes: inserted.notes } })
    return inserted
  })
  await onTankDataChanged(tankId, { actor })
  return row
}

/** The first livestock as the event form would store it (the same time bounds, count and note rules); 400 otherwise. */
function firstLivestock(livestock: NonNullable<StartStockingInput['livestock']>, now: Date) {
  const checked = toCanonicalEvent({ at: livestock.at ?? now.toISOString(), kind: 'livestock-added', amount: livestock.count, doseBasis: 'N', volumeUnit: 'L', group: livestock.group, notes: livestock.notes ?? null }, now)
  if (!checked.ok) fieldError(checked.issues.map(issue => ({ ...issue, field: `livestock.${issue.field}` })))
  return checked.event
}

/** Moves a signed-off tank to stocking, recording the first livestock when given. */
export async function startStocking(actor: Actor, tank: typeof tanks.$inferSelect, input: StartStockingInput, now = new Date()) {
  if (!canManageTank(actor, tank)) throw createError({ statusCode: 403, statusMessage: 'Only the company\'s aquarists and admins may start stocking' })
  if (tank.status !== 'signed-off') throw createError({ statusCode: 409, statusMessage: tank.status === 'stocking' ? 'Stocking has already started' : 'Stocking starts after the sign-off' })
  const db = useDB()
  const first = input.livestock ? firstLivestock(input.livestock, now) : undefined
  const eventId = await writeTransaction(() => {
    if (first) assertEntryUnlocked(tank.id, first.at)
    const livestock = first
      ? db.insert(events).values({ tankId: tank.id, ...eventColumns(first), enteredBy: actor.id }).returning().get()
      : undefined
    moveTank({ tankId: tank.id, trigger: 'stocking-started', actor })
    writeAudit(actor, { action: 'tank.start-stocking', entity: 'tank', entityId: tank.id, before: { status: tank.status }, after: { status: 'stocking', livestockEventId: livestock?.id ?? null, group: livestock?.group ?? null } })
    return livestock?.id ?? null
  })
  await onTankDataChanged(tank.id, { actor, now })
  return { status: 'stocking' as const, eventId }
}
