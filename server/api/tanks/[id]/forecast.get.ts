import { IdParams } from '#shared/schemas/common'
import type { TankForecastView } from '#shared/types/forecast'

/**
 * GET /api/tanks/:id/forecast — when the cycle is likely to be proven complete and each
 * livestock group's earliest likely range, computed now from the tank's current tests.
 * A forecast, never a promise: the verdict decides. Made in the heavy-work pool for a tank with a
 * long history (tankEvaluationNow). Returns TankForecastView.
 */
export default defineEventHandler(async (event): Promise<TankForecastView> => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const now = requestNow(event)
  const forecast = (await tankEvaluationNow(tank.id, now))?.forecast
  if (!forecast) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  return { tankId: tank.id, computedAt: now.toISOString(), forecast }
})
