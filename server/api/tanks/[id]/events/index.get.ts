import { IdParams } from '#shared/schemas/common'
import { EventListQuerySchema } from '#shared/schemas/reading'

/** GET /api/tanks/:id/events — one page of the tank's events (from/to, sort, dir, page, pageSize). Returns EventList. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const query = await getValidatedQuery(event, valid(EventListQuerySchema))
  return listEvents(actor, tank, query)
})
