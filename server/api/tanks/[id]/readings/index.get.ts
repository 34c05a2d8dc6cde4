import { IdParams } from '#shared/schemas/common'
import { ReadingListQuerySchema } from '#shared/schemas/reading'

/** GET /api/tanks/:id/readings — one page of the tank's readings (from/to, sort, dir, page, pageSize). Returns ReadingList. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const query = await getValidatedQuery(event, valid(ReadingListQuerySchema))
  return listReadings(actor, tank, query)
})
