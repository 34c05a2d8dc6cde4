import { IdParams } from '#shared/schemas/common'
import { setPersonActive } from '../../../domain/people/commands'

/** POST /api/people/:id/reactivate — lets a deactivated person sign in again. Returns { id, active }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const result = setPersonActive(useDB(), actor, id, true, requestNow(event))
  if (!result.ok) throw createError({ statusCode: result.status, statusMessage: result.message })
  return { id: result.person.id, active: result.person.active }
})
