import { ReadingCorrectionSchema, ReadingParams } from '#shared/schemas/sign-off'
import { STAFF_ROLES } from '#shared/vocabulary'

/**
 * POST /api/tanks/:id/readings/:readingId/corrections — corrects a reading with a new,
 * linked entry and a reason; the corrected row stays as it was and the engine uses the
 * correction. Values left out are carried over. Staff only. Returns 201 with the new
 * reading; 409 when the reading was already corrected (correct the latest correction).
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id, readingId } = await getValidatedRouterParams(event, valid(ReadingParams))
  const tank = requireVisibleTank(actor, id)
  requireReading(tank.id, readingId)
  const input = await readValidatedBody(event, valid(ReadingCorrectionSchema))
  const row = await correctReading(actor, tank.id, readingId, input, requestNow(event))
  setResponseStatus(event, 201)
  return row
})
