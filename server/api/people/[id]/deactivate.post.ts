import { IdParams } from '#shared/schemas/common'
import { setPersonActive } from '../../../domain/people/commands'

/** POST /api/people/:id/deactivate — switches an account off and ends its sessions at once (never yourself, never the last admin). Returns { id, active }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const result = setPersonActive(useDB(), actor, id, false, requestNow(event))
  if (!result.ok) throw createError({ statusCode: result.status, statusMessage: result.message })
  return { id: result.person.id, active: result.person.active }
})
