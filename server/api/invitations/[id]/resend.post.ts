import { IdParams } from '#shared/schemas/common'
import { recordAudit } from '#server/domain/audit/record'
import { mayHandleAccountOf } from '#server/domain/people/invitations'
import { findPerson } from '#server/domain/people/queries'

/**
 * POST /api/invitations/:id/resend — e-mails a fresh invitation link; the older link stops
 * working. `:id` is the invited person. Counted with invitations: at most a few mails per
 * address a day (past that the answer is the same and nothing is sent, so it never tells
 * whether others wrote to the address) and per inviting account an hour (429).
 * Returns { sentTo, expiresAt }.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const now = requestNow(event)
  const db = useDB()
  const person = findPerson(db, actor.organisationId, id)
  if (!person || !mayHandleAccountOf(actor, person)) throw createError({ statusCode: 404, statusMessage: 'Invitation not found' })
  if (person.passwordHash !== null) throw createError({ statusCode: 409, statusMessage: `${person.name} has already accepted the invitation.` })
  if (!person.active) throw createError({ statusCode: 409, statusMessage: `${person.name}'s account is deactivated: reactivate it first.` })
  await requireInvitationAllowance(event, actor.id)
  const answer = { sentTo: person.email, expiresAt: new Date(now.getTime() + TOKEN_TTL_MS.invite).toISOString() }
  if (!await mayMailInvitee(event, person.email)) return answer
  await writeTransaction((t) => {
    queueInvitation(t, person, actor.name, now)
    recordAudit(t, actor, { action: 'user.invite-resend', entity: 'user', entityId: person.id, after: { email: person.email } })
  })
  kickMailWorker()
  return answer
})
