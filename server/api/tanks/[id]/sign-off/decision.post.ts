import { IdParams } from '#shared/schemas/common'
import { SignOffDecisionSchema } from '#shared/schemas/sign-off'

/**
 * POST /api/tanks/:id/sign-off/decision — the tank's supervisor (or an admin) approves the
 * waiting request or returns it with a note. Approving against the engine's verdict needs
 * a written reason (400 otherwise) and is stored as an override. The engine input and
 * verdict are stored with the decision (for a long history the whole decision is made in the
 * heavy-work pool; 409 when the tank's tests kept changing while it was checked). Returns
 * SignOffRecordWithSnapshot: the verdict and the tank as signed, not the input (megabytes for an
 * imported history).
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'supervisor'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(SignOffDecisionSchema))
  const tank = requireVisibleTank(actor, id)
  const { signOff } = await decideSignOff(actor, tank, input.decision, input.note)
  return toSignOffRecordWithSnapshot(signOff, userNames(actor.organisationId))
})
