import { and, asc, eq, inArray } from 'drizzle-orm'
import type { StaffMember } from '#shared/types/clients'
import type { ListOf } from '#shared/types/list'
import { STAFF_ROLES } from '#shared/vocabulary'
import { users } from '#server/db/schema'

/** GET /api/staff — the company's active admins, aquarists and supervisors, for assignment pickers. Returns ListOf<StaffMember>. */
export default defineEventHandler(async (event): Promise<ListOf<StaffMember>> => {
  const actor = await requireActor(event, STAFF_ROLES)
  const items = useDB().select({ id: users.id, name: users.name, role: users.role }).from(users)
    .where(and(eq(users.organisationId, actor.organisationId), eq(users.active, true), inArray(users.role, STAFF_ROLES)))
    .orderBy(asc(users.name)).all() as StaffMember[]
  return { items }
})
