/**
 * Invitations: who may follow one up, and withdrawing one nobody accepted (its audit row
 * in the same transaction). Framework-free.
 */
import { and, eq, isNull } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { recordAudit } from '#server/domain/audit/record'
import { users } from '#server/db/schema'
import type { Role } from '#shared/types/roles'
import { findPerson } from './queries'

export interface PeopleActor { id: string, organisationId: string, role: Role }

type Person = typeof users.$inferSelect

/** The withdrawn person, or why nothing was withdrawn. */
export type WithdrawResult
  = | { ok: true, person: Person }
    | { ok: false, status: 404 | 409, message: string }

/** Whether the actor may handle this person's invitation or reset: admins anyone's, aquarists clients' only. */
export function mayHandleAccountOf(actor: PeopleActor, person: Pick<Person, 'role'>): boolean {
  return actor.role === 'admin' || (actor.role === 'aquarist' && person.role === 'client')
}

/**
 * Withdraws an invitation nobody has accepted yet: the account is removed with its links,
 * so the e-mailed link stops working and the address can be invited again.
 */
export function withdrawInvitation(db: Db, actor: PeopleActor, personId: string): WithdrawResult {
  return db.transaction((t) => {
    const person = findPerson(t, actor.organisationId, personId)
    if (!person || !mayHandleAccountOf(actor, person)) return { ok: false, status: 404, message: 'Invitation not found' }
    if (person.passwordHash !== null) return { ok: false, status: 409, message: `${person.name} has already accepted the invitation; deactivate the account instead.` }
    t.delete(users).where(and(eq(users.id, person.id), isNull(users.passwordHash))).run()
    recordAudit(t, actor, { action: 'user.invite-withdraw', entity: 'user', entityId: person.id, before: { name: person.name, email: person.email, role: person.role } })
    return { ok: true, person }
  })
}
