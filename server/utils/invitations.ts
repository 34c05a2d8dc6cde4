/** E-mailing account links (invitation, password reset) inside the caller's transaction: a new link retires the older ones. */
import { eq } from 'drizzle-orm'
import type { Db } from '../db/connection'
import { enqueueMail } from '../db/outbox'
import { organisations } from '../db/schema'

interface Recipient { id: string, name: string, email: string, organisationId: string }

const link = (path: string, token: string) => `${publicBaseUrl().replace(/\/+$/, '')}${path}?token=${token}`

/** Issues a fresh invitation link for the person and queues its e-mail, signed by the inviter. */
export function queueInvitation(db: Db, person: Recipient, inviterName: string, now: Date): void {
  const company = db.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, person.organisationId)).get()?.name ?? 'your company'
  const token = issueToken(db, person.id, 'invite', now)
  const words = inviteMail(person.name, inviterName, company, link('/accept-invite', token))
  enqueueMail(db, { organisationId: person.organisationId, to: person.email, kind: 'invite', ...words }, now)
}

/** Issues a fresh password-reset link for the person and queues its e-mail. */
export function queuePasswordReset(db: Db, person: Recipient, now: Date): void {
  const token = issueToken(db, person.id, 'reset', now)
  const words = resetMail(person.name, link('/reset-password', token))
  enqueueMail(db, { organisationId: person.organisationId, to: person.email, kind: 'reset', ...words }, now)
}
