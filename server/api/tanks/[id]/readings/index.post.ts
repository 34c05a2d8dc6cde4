import { eq } from 'drizzle-orm'
import { IdParams } from '#shared/schemas/common'
import { ReadingInputSchema } from '#shared/schemas/reading'
import { toCanonicalReading } from '#shared/readings/entry'
import type { ReadingSaved } from '#shared/types/readings'
import { tanks } from '#server/db/schema'
import { insertTest } from '#server/domain/readings/new-test'
import { tankDataRevisionInDb } from '#server/domain/readings/data-revision'
import { noteTestAppended } from '#server/domain/readings/engine-input-cache'

/**
 * POST /api/tanks/:id/readings — records one test session in canonical units and
 * re-evaluates the tank. Values outside physical bounds are 400 per field; alarming ones
 * are stored and returned in `flags`. 429 when the test's day already holds
 * TESTS_PER_TANK_PER_DAY tests. Returns ReadingSaved (201).
 */
export default defineEventHandler(async (event): Promise<ReadingSaved> => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(ReadingInputSchema))
  const result = toCanonicalReading(input)
  if (!result.ok) fieldError(result.issues)
  const db = useDB()
  const { row, revisionAfterInsert } = await writeTransaction(() => {
    // Checked under the write lock: a sign-off decided while this save waited for it counts.
    assertWritableAt(tank.id, result.reading.takenAt)
    const inserted = insertTest(db, tank.id, actor.id, result.reading)
    // Read right after the insert, in its transaction: the kept engine input may take this test in place of a re-read.
    const revisionAfterInsert = tankDataRevisionInDb(db, tank.id)
    assertDayNotOverfull(event, db, tank.id, inserted.takenAt)
    if (input.photoUploadId && !attachTestPhoto(tank, inserted.id, input.photoUploadId)) {
      fieldError([{ field: 'photoUploadId', message: 'That photo was not found for this tank.' }])
    }
    writeAudit(actor, { action: 'reading.create', entity: 'reading', entityId: inserted.id, after: inserted })
    const basis = input.basis
    const current = tank.kitBasis
    if (input.rememberBasis && (basis.ammonia !== current.ammonia || basis.nitrite !== current.nitrite || basis.nitrate !== current.nitrate)) {
      db.update(tanks).set({ kitBasis: basis }).where(eq(tanks.id, tank.id)).run()
      writeAudit(actor, { action: 'tank.kit-basis', entity: 'tank', entityId: tank.id, before: current, after: basis })
    }
    return { row: inserted, revisionAfterInsert }
  })
  noteTestAppended(db, tank.id, row, revisionAfterInsert)
  const verdict = await onTankDataChanged(tank.id, { readingId: row.id, actor, appended: { row, revisionAfter: revisionAfterInsert } })
  setResponseStatus(event, 201)
  return { reading: toReadingView(row, actor.name, actor, tank), flags: result.reading.flags, ...verdictOnSave(verdict) }
})
