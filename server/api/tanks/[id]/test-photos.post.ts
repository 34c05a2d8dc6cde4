import { IdParams } from '#shared/schemas/common'
import { hasPendingPhotoRoom, PENDING_PHOTOS_PER_TANK } from '#server/domain/uploads/pending-photos'

/**
 * POST /api/tanks/:id/test-photos — stores a photo of a water test (JPEG, PNG, WebP) or a PDF
 * before the reading is saved, multipart field `file`; the reading then names it as
 * `photoUploadId`. A photo never attached is removed after a day; a tank holds at most 20
 * waiting at once (429). Returns UploadView with status 201; 413 too large, 415 wrong type.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const noRoom = () => createError({ statusCode: 429, statusMessage: 'Too many photos waiting', message: `This tank already has ${PENDING_PHOTOS_PER_TANK} photos that no saved test uses. Save the tests they belong to, or wait a day until unused photos are removed.` })
  // Refused early when already full, so a full tank's uploads are not read and thumbnailed for nothing;
  // the check that holds is the one inside the insert's transaction.
  if (!hasPendingPhotoRoom(useDB(), tank.id)) throw noRoom()
  const file = await receiveUpload(event)
  const row = await storeUpload(actor, { tankId: tank.id }, file, (db) => {
    if (!hasPendingPhotoRoom(db, tank.id)) throw noRoom()
  })
  setResponseStatus(event, 201)
  return toUploadView(row, new Map([[actor.id, actor.name]]))
})
