import { TankListQuerySchema } from '#shared/schemas/tank-list'

/** GET /api/tanks — the tanks the user may see, paginated, filtered and sorted. Returns TankList. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const query = await getValidatedQuery(event, valid(TankListQuerySchema))
  return await listTanks(actor, query, requestNow(event))
})
