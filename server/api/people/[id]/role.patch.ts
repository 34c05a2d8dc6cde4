import { IdParams } from '#shared/schemas/common'
import { PersonRoleSchema } from '#shared/schemas/people'
import { changePersonRole } from '#server/domain/people/people'
import { findPerson } from '#server/domain/people/queries'

/** PATCH /api/people/:id/role — admin only: moves a staff member to another staff role and ends their sessions. Returns { person: PersonView }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  if (!findPerson(useDB(), actor.organisationId, id)) throw createError({ statusCode: 404, statusMessage: 'Person not found' })
  const { role } = await readValidatedBody(event, valid(PersonRoleSchema))
  return { person: await writeTransaction(db => personChange(() => changePersonRole(db, actor, id, role, requestNow(event)))) }
})
