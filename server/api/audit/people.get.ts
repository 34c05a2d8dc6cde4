import type { ListOf } from '#shared/types/list'
import { auditPeople } from '#server/domain/audit/trail'

/** GET /api/audit/people — the company's people (including deactivated ones), for the audit trail's person filter. Returns ListOf<{ id, name }>. */
export default defineEventHandler(async (event): Promise<ListOf<{ id: string, name: string }>> => {
  const actor = await requireActor(event, ['admin', 'supervisor'])
  return { items: auditPeople(useDB(), actor.organisationId) }
})
