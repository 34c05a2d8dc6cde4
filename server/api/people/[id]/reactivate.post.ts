import { IdParams } from '#shared/schemas/common'
import { reactivatePerson } from '#server/domain/people/people'

/** POST /api/people/:id/reactivate — admin only: a deactivated person may sign in again. Returns { person: PersonView }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  return { person: await writeTransaction(db => personChange(() => reactivatePerson(db, actor, id))) }
})
