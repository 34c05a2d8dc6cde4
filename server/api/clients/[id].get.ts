import { IdParams } from '#shared/schemas/common'
import { STAFF_ROLES } from '#shared/vocabulary'

/** GET /api/clients/:id — one client of the company with its sites. Returns ClientView; 404 otherwise. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const view = clientView(actor, id)
  if (!view) throw createError({ statusCode: 404, statusMessage: 'Client not found' })
  return view
})
