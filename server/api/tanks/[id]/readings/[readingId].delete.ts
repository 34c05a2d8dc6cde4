import { eq } from 'drizzle-orm'
import { ReadingParams } from '#shared/schemas/reading'
import { readings } from '#server/db/schema'

/** DELETE /api/tanks/:id/readings/:readingId — removes a reading (kept in the audit log). Returns 204. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id, readingId } = await getValidatedRouterParams(event, valid(ReadingParams))
  const tank = requireVisibleTank(actor, id)
  const db = useDB()
  // Found and checked under the write lock: a delete or sign-off that went first while this one waited counts.
  await writeTransaction(() => {
    const existing = requireReading(tank.id, readingId)
    assertEditable(actor, tank, { id: existing.id, enteredBy: existing.enteredBy, createdAt: existing.createdAt, at: existing.takenAt })
    db.delete(readings).where(eq(readings.id, existing.id)).run()
    writeAudit(actor, { action: 'reading.delete', entity: 'reading', entityId: existing.id, before: existing })
  })
  await onTankDataChanged(tank.id, { actor })
  setResponseStatus(event, 204)
  return null
})
