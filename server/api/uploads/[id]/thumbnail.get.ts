import { IdParams } from '#shared/schemas/common'

/** GET /api/uploads/:id/thumbnail — a small WebP preview of an uploaded image, for users who may see its tank; 404 for PDFs. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const row = requireVisibleUpload(actor, id)
  if (!row.thumbnailKey) throw createError({ statusCode: 404, statusMessage: 'No preview for this file' })
  return sendStoredFile(event, row.thumbnailKey, 'image/webp', `${row.originalName}.webp`)
})
