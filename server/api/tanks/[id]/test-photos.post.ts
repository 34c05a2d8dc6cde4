import { IdParams } from '#shared/schemas/common'

/**
 * POST /api/tanks/:id/test-photos — stores a photo of a water test (JPEG, PNG, WebP) or a PDF
 * before the reading is saved, multipart field `file`; the reading then names it as
 * `photoUploadId`. Returns UploadView with status 201; 413 too large, 415 wrong type.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const file = await receiveUpload(event)
  const row = await storeUpload(actor, { tankId: tank.id }, file)
  setResponseStatus(event, 201)
  return toUploadView(row, new Map([[actor.id, actor.name]]))
})
