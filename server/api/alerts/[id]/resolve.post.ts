import { AlertResolveSchema } from '#shared/schemas/alerts'
import { IdParams } from '#shared/schemas/common'
import { STAFF_ROLES } from '#shared/vocabulary'

/** POST /api/alerts/:id/resolve — an aquarist, supervisor or admin resolves an alert by hand with a note. Returns AlertView; 409 if already resolved. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const now = requestNow(event)
  const current = getAlert(actor, id, now)
  if (!current) throw createError({ statusCode: 404, statusMessage: 'Alert not found' })
  const { note } = await readValidatedBody(event, valid(AlertResolveSchema))
  if (!await resolveAlert(actor, id, note, now)) throw createError({ statusCode: 409, statusMessage: 'The alert is already resolved' })
  return getAlert(actor, id, now)
})
