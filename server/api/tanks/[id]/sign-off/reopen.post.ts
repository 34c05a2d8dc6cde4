import { IdParams } from '#shared/schemas/common'
import { SignOffReopenSchema } from '#shared/schemas/sign-off'

/**
 * POST /api/tanks/:id/sign-off/reopen — the tank's supervisor (or an admin) reopens the
 * current sign-off with a reason: the record unlocks, the certificate stops verifying as
 * valid and the tank goes back to cycling. Audited. Returns the SignOffRecord.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'supervisor'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(SignOffReopenSchema))
  const tank = requireVisibleTank(actor, id)
  const row = await reopenSignOff(actor, tank, input.reason)
  return toSignOffRecord(row, userNames(actor.organisationId))
})
