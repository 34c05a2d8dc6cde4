import { eq } from 'drizzle-orm'
import { EventParams, EventPatchSchema, type EventInput } from '#shared/schemas/reading'
import { toCanonicalEvent } from '#shared/readings/events'
import type { EventView } from '#shared/types/readings'
import { events } from '#server/db/schema'
import { eventColumns } from '#server/domain/readings/columns'

/**
 * PATCH /api/tanks/:id/events/:eventId — corrects an event; given fields replace the stored
 * ones (amounts in canonical units unless a basis/unit is given). Returns EventView.
 */
export default defineEventHandler(async (event): Promise<EventView> => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id, eventId } = await getValidatedRouterParams(event, valid(EventParams))
  const tank = requireVisibleTank(actor, id)
  const existing = requireEvent(tank.id, eventId)
  assertEditable(actor, tank, { id: existing.id, enteredBy: existing.enteredBy, createdAt: existing.createdAt, at: existing.at })
  const patch = await readValidatedBody(event, valid(EventPatchSchema))
  const start: EventInput = { at: existing.at, kind: existing.kind, amount: existing.amount, doseBasis: 'N', volumeUnit: 'L', group: existing.group as EventInput['group'], notes: existing.notes }
  const merged = { ...start, ...Object.fromEntries(Object.entries(patch).filter(([, value]) => value !== undefined)) } as EventInput
  const result = toCanonicalEvent(merged)
  if (!result.ok) fieldError(result.issues)
  const db = useDB()
  const row = await writeTransaction(() => {
    // Checked again under the write lock: a sign-off decided while this edit waited for it counts.
    assertEditable(actor, tank, { id: existing.id, enteredBy: existing.enteredBy, createdAt: existing.createdAt, at: existing.at })
    assertWritableAt(tank.id, result.event.at)
    const updated = db.update(events).set(eventColumns(result.event)).where(eq(events.id, existing.id)).returning().get()
    writeAudit(actor, { action: 'event.update', entity: 'event', entityId: existing.id, before: existing, after: updated })
    return updated
  })
  await onTankDataChanged(tank.id, { actor })
  return toEventView(row, userName(row.enteredBy ?? ''), actor, tank)
})
