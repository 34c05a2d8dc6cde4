import { IdParams } from '#shared/schemas/common'
import type { TankForecastView } from '#shared/types/forecast'
import { storedForecasts } from '#server/db/verdicts'

/**
 * GET /api/tanks/:id/forecast — when the cycle is likely to be proven complete and each
 * livestock group's earliest likely range: the forecast made with the tank's verdict from the
 * same tests at the same time (made again first when older than the verdict interval, in the
 * heavy-work pool for a long history), so reading it runs no engine. A forecast, never a
 * promise: the verdict decides. Returns TankForecastView.
 */
export default defineEventHandler(async (event): Promise<TankForecastView> => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const stored = await currentVerdictRow(tank.id, requestNow(event))
  const forecast = stored && storedForecasts(useDB(), [tank.id]).get(tank.id)
  if (!stored || !forecast) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  return { tankId: tank.id, computedAt: stored.evaluatedAt, forecast }
})
