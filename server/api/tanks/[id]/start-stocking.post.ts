import { IdParams } from '#shared/schemas/common'
import { StartStockingSchema } from '#shared/schemas/sign-off'

/**
 * POST /api/tanks/:id/start-stocking — after sign-off, an aquarist or admin starts
 * stocking, optionally recording the first livestock (a 'livestock-added' event under the
 * event form's rules — a count, no future date: 400 — which may not be back-dated into the
 * signed period: 409). The tank becomes 'stocking'.
 * Returns { status, eventId }.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(StartStockingSchema))
  const tank = requireVisibleTank(actor, id)
  return await startStocking(actor, tank, input, requestNow(event))
})
