import { and, asc, eq, inArray } from 'drizzle-orm'
import type { StaffMember } from '#shared/types/clients'
import { STAFF_ROLES } from '#shared/vocabulary'
import { users } from '#server/db/schema'

/** GET /api/staff — the company's active admins, aquarists and supervisors, for assignment pickers. Returns StaffMember[]. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  return useDB().select({ id: users.id, name: users.name, role: users.role }).from(users)
    .where(and(eq(users.organisationId, actor.organisationId), eq(users.active, true), inArray(users.role, STAFF_ROLES)))
    .orderBy(asc(users.name)).all() as StaffMember[]
})
