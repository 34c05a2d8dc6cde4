import { IdParams } from '#shared/schemas/common'
import { EvidenceQuerySchema } from '#shared/schemas/sign-off'
import { STAFF_ROLES } from '#shared/vocabulary'

/**
 * GET /api/tanks/:id/evidence — everything behind a sign-off decision: the tank, the
 * engine's verdict now, readings and events a page of EVIDENCE_PAGE_SIZE at a time
 * (`?page=1`, the default, is the newest; corrections linked), the build plan's stages
 * with checklists, upload metadata, alert history and every sign-off with its snapshot.
 * Staff only. Returns Evidence, sent as the JSON text tankEvidence writes.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const { page } = await getValidatedQuery(event, valid(EvidenceQuerySchema))
  const evidence = await tankEvidence(actor, id, new Date(), page)
  if (!evidence) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  setResponseHeader(event, 'content-type', 'application/json')
  return evidence
})
