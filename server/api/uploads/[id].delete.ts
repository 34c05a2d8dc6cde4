import { eq } from 'drizzle-orm'
import { IdParams } from '#shared/schemas/common'
import { readings } from '#server/db/schema'
import { mayRemoveUpload, removeUploadRow } from '#server/domain/uploads/remove'

/**
 * DELETE /api/uploads/:id — removes a photo or file; only whoever added it may (403 for others who
 * see the tank, 404 for those who do not). A file in a signed-off record is 409. Returns 204.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const row = requireVisibleUpload(actor, id)
  if (!mayRemoveUpload(row, actor.id)) throw createError({ statusCode: 403, statusMessage: 'Only the person who added this file can remove it.' })
  // Checked under the write lock: a sign-off decided while this removal waited for it counts.
  await writeTransaction((db) => {
    if (row.stageId) {
      const stage = findStage(row.tankId, row.stageId)
      if (stage) assertStageUnsigned(row.tankId, stage.key)
    }
    if (row.readingId) {
      const reading = db.select({ id: readings.id, takenAt: readings.takenAt }).from(readings).where(eq(readings.id, row.readingId)).get()
      if (reading) assertEntryUnlocked(row.tankId, reading.takenAt, reading.id)
    }
    removeUploadRow(db, actor, row)
  })
  // The bytes go after the row's commit, so a failed delete never leaves a row without its file.
  const storage = useStorage('uploads')
  await storage.removeItem(row.storageKey)
  if (row.thumbnailKey) await storage.removeItem(row.thumbnailKey)
  setResponseStatus(event, 204)
  return null
})
