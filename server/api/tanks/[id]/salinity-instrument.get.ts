import { IdParams } from '#shared/schemas/common'
import { salinityInstrumentOf } from '#server/domain/instruments/salinity'

/**
 * GET /api/tanks/:id/salinity-instrument — how the signed-in person last measured this tank's
 * salinity, so the daily form opens that way on any device. Returns { instrument } (null when
 * they have not tested salinity on this tank yet).
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  return { instrument: salinityInstrumentOf(useDB(), actor.id, tank.id) }
})
