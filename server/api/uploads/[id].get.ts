import { IdParams } from '#shared/schemas/common'

/** GET /api/uploads/:id — the stored file, for users who may see its tank. Returns the bytes with their detected type. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const row = requireVisibleUpload(actor, id)
  return sendStoredFile(event, row.storageKey, row.mimeType, row.originalName)
})
