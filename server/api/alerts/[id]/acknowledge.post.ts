import { AlertAcknowledgeSchema } from '#shared/schemas/alerts'
import { IdParams } from '#shared/schemas/common'
import { STAFF_ROLES } from '#shared/vocabulary'

/** POST /api/alerts/:id/acknowledge — staff acknowledge an open alert (optional note); this stops its escalation. Returns AlertView; 409 if it is not open. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const now = requestNow(event)
  const current = getAlert(actor, id, now)
  if (!current) throw createError({ statusCode: 404, statusMessage: 'Alert not found' })
  const { note } = await readValidatedBody(event, valid(AlertAcknowledgeSchema))
  if (!await acknowledgeAlert(actor, id, note || null, now)) throw createError({ statusCode: 409, statusMessage: `The alert is already ${current.status}` })
  return getAlert(actor, id, now)
})
