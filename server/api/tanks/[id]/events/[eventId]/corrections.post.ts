import { EventCorrectionSchema, EventParams } from '#shared/schemas/sign-off'
import { STAFF_ROLES } from '#shared/vocabulary'

/**
 * POST /api/tanks/:id/events/:eventId/corrections — corrects an event with a new, linked
 * entry and a reason; the corrected row stays and the engine uses the correction. Staff
 * only. Returns 201 with the new event; 409 when it was already corrected.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id, eventId } = await getValidatedRouterParams(event, valid(EventParams))
  const tank = requireVisibleTank(actor, id)
  requireEvent(tank.id, eventId)
  const input = await readValidatedBody(event, valid(EventCorrectionSchema))
  const row = await correctEvent(actor, tank.id, eventId, input, requestNow(event))
  setResponseStatus(event, 201)
  return row
})
