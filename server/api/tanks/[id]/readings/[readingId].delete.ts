import { eq } from 'drizzle-orm'
import { ReadingParams } from '#shared/schemas/reading'
import { readings } from '#server/db/schema'

/** DELETE /api/tanks/:id/readings/:readingId — removes a reading (kept in the audit log). Returns 204. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id, readingId } = await getValidatedRouterParams(event, valid(ReadingParams))
  const tank = requireVisibleTank(actor, id)
  const existing = requireReading(tank.id, readingId)
  assertEditable(actor, tank, { id: existing.id, enteredBy: existing.enteredBy, createdAt: existing.createdAt, at: existing.takenAt })
  const db = useDB()
  db.transaction(() => {
    db.delete(readings).where(eq(readings.id, existing.id)).run()
    writeAudit(actor, { action: 'reading.delete', entity: 'reading', entityId: existing.id, before: existing })
  })
  await onTankDataChanged(tank.id, { actor })
  setResponseStatus(event, 204)
  return null
})
