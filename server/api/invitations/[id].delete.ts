import { IdParams } from '#shared/schemas/common'
import { withdrawInvitation } from '#server/domain/people/invitations'

/** DELETE /api/invitations/:id — withdraws an invitation nobody accepted: the account and its e-mailed link stop existing. Returns { withdrawn }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const result = await writeTransaction(db => withdrawInvitation(db, actor, id))
  if (!result.ok) throw createError({ statusCode: result.status, statusMessage: result.message })
  return { withdrawn: result.person.id }
})
