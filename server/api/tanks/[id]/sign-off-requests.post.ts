import { IdParams } from '#shared/schemas/common'
import { SignOffRequestSchema } from '#shared/schemas/sign-off'

/**
 * POST /api/tanks/:id/sign-off-requests — an aquarist or admin asks the tank's supervisor
 * to sign off a cycle the engine judges complete; the tank becomes 'cycled'.
 * The engine runs in the heavy-work pool for a long history. Returns 201 with the SignOffRecord;
 * 409 when the cycle is not complete, a request waits, or the tank's tests kept changing while it was checked.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(SignOffRequestSchema))
  const tank = requireVisibleTank(actor, id)
  const row = await requestSignOff(actor, tank, input.note)
  setResponseStatus(event, 201)
  return toSignOffRecord(row, userNames(actor.organisationId))
})
