import { and, eq } from 'drizzle-orm'
import { InvitationSchema } from '#shared/schemas/account'
import { enqueueMail } from '#server/db/outbox'
import { readOrganisationSettings } from '#server/db/settings'
import { clients, organisations, users } from '#server/db/schema'
import { alreadyHasAccountMail } from '#server/domain/accounts/account-mail'

/**
 * POST /api/invitations — invites someone by e-mail: aquarists and admins invite clients,
 * only the admin invites staff. Creates the account without a password and e-mails a
 * single-use link. An address that already has an account gets the same answer and a mail
 * saying so. At most a few mails per address a day and invitations per inviter an hour (429).
 * Returns { user: { email, name, role } } with 201.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const input = await readValidatedBody(event, valid(InvitationSchema))
  if (input.role !== 'client' && actor.role !== 'admin') throw createError({ statusCode: 403, statusMessage: 'Only the admin invites staff' })
  const db = useDB()
  if (input.role === 'client') {
    const client = db.select({ id: clients.id }).from(clients).where(and(eq(clients.id, input.clientId!), eq(clients.organisationId, actor.organisationId))).get()
    if (!client) throw createError({ statusCode: 404, statusMessage: 'Client not found' })
  }
  await requireInvitationAllowance(event, actor.id)
  const now = requestNow(event)
  const company = db.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, actor.organisationId)).get()?.name ?? 'your company'
  const answer = { user: { email: input.email, name: input.name, role: input.role } }
  setResponseStatus(event, 201)
  // An address that has an account (here or at another company) gets the same answer; its
  // owner is told by mail instead, so the answer reveals nothing about who uses Tidewright.
  const existing = db.select({ id: users.id, name: users.name, organisationId: users.organisationId }).from(users).where(eq(users.email, input.email)).get()
  if (existing) {
    if (await mayMailInvitee(event, input.email)) {
      await writeTransaction((tx) => {
        const words = alreadyHasAccountMail(existing.name, actor.name, company, publicLink('/login'), publicLink('/forgot-password'))
        enqueueMail(tx, { organisationId: actor.organisationId, to: input.email, kind: 'invite', ...words }, now)
        writeAudit(actor, { action: 'user.invite-existing', entity: 'user', entityId: null, after: { role: input.role } })
      })
      kickMailWorker()
    }
    return answer
  }
  if (!await mayMailInvitee(event, input.email)) return answer
  await writeTransaction((t) => {
    const created = t.insert(users).values({
      organisationId: actor.organisationId, email: input.email, name: input.name, role: input.role,
      clientId: input.role === 'client' ? input.clientId! : null, passwordHash: null,
      units: input.units ?? readOrganisationSettings(t, actor.organisationId).defaultUnits,
    }).returning().get()
    queueInvitation(t, created, actor.name, now)
    writeAudit(actor, { action: 'user.invite', entity: 'user', entityId: created.id, after: { email: created.email, role: created.role, clientId: created.clientId } })
  })
  kickMailWorker()
  return answer
})
