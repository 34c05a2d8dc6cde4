import { IdParams } from '#shared/schemas/common'
import { recordAudit } from '#server/domain/audit/record'
import { findPerson } from '#server/domain/people/queries'

/** POST /api/people/:id/password-reset — e-mails the person a link to choose a new password (their password stays until they use it). Returns { sentTo }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const now = requestNow(event)
  const db = useDB()
  const person = findPerson(db, actor.organisationId, id)
  if (!person) throw createError({ statusCode: 404, statusMessage: 'Person not found' })
  if (!person.active) throw createError({ statusCode: 409, statusMessage: `${person.name}'s account is deactivated: reactivate it first.` })
  if (person.passwordHash === null) throw createError({ statusCode: 409, statusMessage: `${person.name} has not accepted the invitation yet: resend the invitation instead.` })
  await writeTransaction((t) => {
    queuePasswordReset(t, person, now)
    recordAudit(t, actor, { action: 'user.reset-sent', entity: 'user', entityId: person.id, after: { email: person.email } })
  })
  kickMailWorker()
  return { sentTo: person.email }
})
