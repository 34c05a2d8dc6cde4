import { IdParams } from '#shared/schemas/common'

/**
 * GET /api/tanks/:id/sign-off — the tank's sign-off state for its page: the current and
 * past sign-offs, what the user may do next, and after sign-off the livestock and
 * lighting plan. Returns SignOffState; 404 when the tank is not visible.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  return await signOffState(actor, tank, requestNow(event))
})
