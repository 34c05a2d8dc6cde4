import { IdParams } from '#shared/schemas/common'
import { deactivatePerson } from '#server/domain/people/people'

/** POST /api/people/:id/deactivate — admin only: the person can no longer sign in and their sessions end now. Returns { person: PersonView }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  return { person: await writeTransaction(db => personChange(() => deactivatePerson(db, actor, id, requestNow(event)))) }
})
