import { and, eq } from 'drizzle-orm'
import { InvitationSchema } from '#shared/schemas/account'
import { enqueueMail } from '../../db/outbox'
import { readOrganisationSettings } from '../../db/settings'
import { clients, organisations, users } from '../../db/schema'
import type { TidewrightDB } from '../../db/connection'

/**
 * POST /api/invitations — invites someone by e-mail: aquarists and admins invite clients,
 * only the admin invites staff. Creates the account without a password and e-mails a
 * single-use link. Returns { user: { id, email, name, role } }; 409 if the e-mail has an account.
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
  if (db.select({ id: users.id }).from(users).where(eq(users.email, input.email)).get()) {
    throw createError({ statusCode: 409, statusMessage: 'That e-mail address already has an account' })
  }
  const now = requestNow(event)
  const company = db.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, actor.organisationId)).get()?.name ?? 'your company'
  const user = db.transaction((tx) => {
    const t = tx as unknown as TidewrightDB
    const created = t.insert(users).values({
      organisationId: actor.organisationId, email: input.email, name: input.name, role: input.role,
      clientId: input.role === 'client' ? input.clientId! : null, passwordHash: null,
      units: readOrganisationSettings(t, actor.organisationId).defaultUnits,
    }).returning().get()
    const token = issueToken(t, created.id, 'invite', now)
    const words = inviteMail(created.name, actor.name, company, `${publicBaseUrl().replace(/\/+$/, '')}/accept-invite?token=${token}`)
    enqueueMail(t, { organisationId: actor.organisationId, to: created.email, kind: 'invite', ...words }, now)
    return created
  })
  writeAudit(actor, { action: 'user.invite', entity: 'user', entityId: user.id, after: { email: user.email, role: user.role, clientId: user.clientId } })
  kickMailWorker()
  setResponseStatus(event, 201)
  return { user: { id: user.id, email: user.email, name: user.name, role: user.role } }
})
