import type { AdminAttention } from '#shared/types/people'
import { adminAttention } from '#server/domain/people/queries'

/** GET /api/admin/attention — what needs the admin: pending invitations, deactivated people still on open tanks, tanks with no aquarist. Returns AdminAttention. */
export default defineEventHandler(async (event): Promise<AdminAttention> => {
  const actor = await requireActor(event, ['admin'])
  return adminAttention(useDB(), actor.organisationId, requestNow(event))
})
