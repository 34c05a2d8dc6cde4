import { eq } from 'drizzle-orm'
import { EventParams } from '#shared/schemas/reading'
import { events } from '#server/db/schema'

/** DELETE /api/tanks/:id/events/:eventId — removes an event (kept in the audit log). Returns 204. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id, eventId } = await getValidatedRouterParams(event, valid(EventParams))
  const tank = requireVisibleTank(actor, id)
  const db = useDB()
  // Found and checked under the write lock: a delete or sign-off that went first while this one waited counts.
  await writeTransaction(() => {
    const existing = requireEvent(tank.id, eventId)
    assertEditable(actor, tank, { id: existing.id, enteredBy: existing.enteredBy, createdAt: existing.createdAt, at: existing.at })
    db.delete(events).where(eq(events.id, existing.id)).run()
    writeAudit(actor, { action: 'event.delete', entity: 'event', entityId: existing.id, before: existing })
  })
  await onTankDataChanged(tank.id, { actor })
  setResponseStatus(event, 204)
  return null
})
