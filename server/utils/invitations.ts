/** Nitro glue for account e-mails (server/domain/accounts/account-mail.ts): links use the configured public base URL. */
import type { Db } from '#server/db/connection'
import { queueInvitation as queueInviteInDb, queuePasswordReset as queueResetInDb } from '#server/domain/accounts/account-mail'

interface Recipient { id: string, name: string, email: string, organisationId: string }

/** Issues a fresh invitation link for the person and queues its e-mail, signed by the inviter (inside the caller's transaction). */
export function queueInvitation(db: Db, person: Recipient, inviterName: string, now: Date): void {
  queueInviteInDb(db, person, inviterName, publicBaseUrl(), now)
}

/** Issues a fresh password-reset link for the person and queues its e-mail (inside the caller's transaction). */
export function queuePasswordReset(db: Db, person: Recipient, now: Date): void {
  queueResetInDb(db, person, publicBaseUrl(), now)
}
