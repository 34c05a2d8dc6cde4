import { IdParams } from '#shared/schemas/common'

/** GET /api/tanks/:id/stages — the tank's build plan: stages in order with checklists, notes, people and uploads. Returns PlanView. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  return planView(actor, tank)
})
