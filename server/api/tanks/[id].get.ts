import { IdParams } from '#shared/schemas/common'

/** GET /api/tanks/:id — one tank the user may see. Returns TankView; 404 otherwise. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = await getTankView(actor, id, requestNow(event))
  if (!tank) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  return tank
})
