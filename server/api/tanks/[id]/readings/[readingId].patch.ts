import { eq } from 'drizzle-orm'
import { ReadingParams, ReadingPatchSchema } from '#shared/schemas/reading'
import { entryFromStored, toCanonicalReading } from '#shared/readings/entry'
import { dayOf } from '#shared/readings/limits'
import type { ReadingSaved } from '#shared/types/readings'
import { readings } from '#server/db/schema'
import { readingColumns } from '#server/domain/readings/columns'

/**
 * PATCH /api/tanks/:id/readings/:readingId — corrects a reading: the given fields replace
 * what was typed (null clears one), the rest is kept. Clients may fix their own entries
 * for 24 h; older changes are staff's. 429 when the edit moves the test into a day that
 * already holds TESTS_PER_TANK_PER_DAY tests. Returns ReadingSaved.
 */
export default defineEventHandler(async (event): Promise<ReadingSaved> => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id, readingId } = await getValidatedRouterParams(event, valid(ReadingParams))
  const tank = requireVisibleTank(actor, id)
  const existing = requireReading(tank.id, readingId)
  assertEditable(actor, tank, { id: existing.id, enteredBy: existing.enteredBy, createdAt: existing.createdAt, at: existing.takenAt })
  const patch = await readValidatedBody(event, valid(ReadingPatchSchema))
  const start = entryFromStored(existing, tank.kitBasis, actor.units === 'us' ? 'F' : 'C')
  const merged = { ...start, ...Object.fromEntries(Object.entries(patch).filter(([, value]) => value !== undefined)) }
  const result = toCanonicalReading(merged)
  if (!result.ok) fieldError(result.issues)
  const db = useDB()
  const row = await writeTransaction(() => {
    // Checked again under the write lock: a sign-off decided while this edit waited for it counts.
    assertEditable(actor, tank, { id: existing.id, enteredBy: existing.enteredBy, createdAt: existing.createdAt, at: existing.takenAt })
    assertWritableAt(tank.id, result.reading.takenAt)
    const updated = db.update(readings).set(readingColumns(result.reading)).where(eq(readings.id, existing.id)).returning().get()
    // Moved to another day: that day must have room. Staying on its day never raises the count.
    if (dayOf(updated.takenAt) !== dayOf(existing.takenAt)) assertDayNotOverfull(event, db, tank.id, updated.takenAt)
    writeAudit(actor, { action: 'reading.update', entity: 'reading', entityId: existing.id, before: existing, after: updated })
    return updated
  })
  const verdict = await onTankDataChanged(tank.id, { readingId: row.id, actor })
  return { reading: toReadingView(row, userName(row.enteredBy ?? ''), actor, tank), flags: result.reading.flags, ...verdictOnSave(verdict) }
})
