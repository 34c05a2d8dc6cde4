import { IdParams } from '#shared/schemas/common'
import { RoleChangeSchema } from '#shared/schemas/people'
import { changeRole } from '../../../domain/people/commands'

/** POST /api/people/:id/role — gives a staff member another staff role (never the last admin); their sessions end. Returns { id, role }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const { role } = await readValidatedBody(event, valid(RoleChangeSchema))
  const result = changeRole(useDB(), actor, id, role, requestNow(event))
  if (!result.ok) throw createError({ statusCode: result.status, statusMessage: result.message })
  return { id: result.person.id, role: result.person.role }
})
