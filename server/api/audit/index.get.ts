import { AuditQuerySchema } from '#shared/schemas/audit'
import type { AuditList } from '#shared/types/audit'
import { readAuditTrail } from '#server/domain/audit/trail'

/** GET /api/audit — one page of the audit trail, newest first, filtered by tank, person, action and days; supervisors see their tanks' rows. Returns AuditList. */
export default defineEventHandler(async (event): Promise<AuditList> => {
  const actor = await requireActor(event, ['admin', 'supervisor'])
  const query = await getValidatedQuery(event, valid(AuditQuerySchema))
  return readAuditTrail(useDB(), actor, query, query)
})
