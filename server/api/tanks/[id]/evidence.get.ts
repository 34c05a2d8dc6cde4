import { IdParams } from '#shared/schemas/common'
import { STAFF_ROLES } from '#shared/vocabulary'

/**
 * GET /api/tanks/:id/evidence — everything behind a sign-off decision: the tank, the
 * engine's verdict now, every reading and event (corrections linked), the build plan's
 * stages with checklists, upload metadata, alert history and every sign-off with its
 * snapshot. Staff only. Returns Evidence.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const evidence = tankEvidence(actor, id)
  if (!evidence) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  return evidence
})
