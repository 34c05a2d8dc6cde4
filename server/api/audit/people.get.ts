import { auditPeople } from '#server/domain/audit/trail'

/** GET /api/audit/people — the company's people (including deactivated ones), for the audit trail's person filter. Returns { id, name }[]. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'supervisor'])
  return auditPeople(useDB(), actor.organisationId)
})
