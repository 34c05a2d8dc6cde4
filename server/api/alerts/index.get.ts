import { AlertListQuery } from '#shared/schemas/alerts'
import { STAFF_ROLES } from '#shared/vocabulary'

/** GET /api/alerts — the company's alerts for staff, by status (open, acknowledged, resolved, active), tank and age. Returns { items: AlertView[] }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const query = await getValidatedQuery(event, valid(AlertListQuery))
  return { items: listAlerts(actor, query, requestNow(event)) }
})
