/**
 * Changing people: role, deactivation and reactivation, withdrawing an invitation. Each
 * command checks the company's rules (never the last admin; nobody switches themselves
 * off) and writes its audit row in the same transaction as the change. Ending the
 * person's sessions is the caller's next step. Framework-free.
 */
import { and, eq, isNull } from 'drizzle-orm'
import type { TidewrightDB } from '../../db/connection'
import { appendAudit } from '../../db/audit'
import { authTokens, users } from '../../db/schema'
import type { Role } from '../../../shared/types/roles'
import { activeAdminCount, findPerson } from './queries'

export interface PeopleActor { id: string, organisationId: string, role: Role }

type Person = typeof users.$inferSelect

/** What a command did: the person after the change, `unchanged` when there was nothing to do, or why it was refused. */
export type PeopleResult
  = | { ok: true, person: Person, changed: boolean }
    | { ok: false, status: 404 | 409, message: string }

const notFound = { ok: false, status: 404, message: 'Person not found' } as const
const refuse = (message: string) => ({ ok: false, status: 409, message }) as const

const lastAdminMessage = (name: string) => `${name} is the company's only active admin: make someone else an admin first.`

/** Gives a staff member another staff role. A client account stays a client; the last active admin stays an admin. */
export function changeRole(db: TidewrightDB, actor: PeopleActor, personId: string, role: Exclude<Role, 'client'>, now = new Date()): PeopleResult {
  return db.transaction((tx) => {
    const t = tx as unknown as TidewrightDB
    const person = findPerson(t, actor.organisationId, personId)
    if (!person) return notFound
    if (person.role === 'client') return refuse('A client account stays a client; invite staff as staff.')
    if (person.role === role) return { ok: true, person, changed: false }
    if (person.role === 'admin' && person.active && activeAdminCount(t, actor.organisationId) <= 1) return refuse(lastAdminMessage(person.name))
    const updated = t.update(users).set({ role, updatedAt: now.toISOString() }).where(eq(users.id, person.id)).returning().get()
    appendAudit(t, actor, { action: 'user.role', entity: 'user', entityId: person.id, before: { role: person.role }, after: { role } }, now)
    return { ok: true, person: updated, changed: true }
  })
}

/** Switches an account off (it can no longer sign in) or on again. Nobody deactivates themselves or the last active admin. */
export function setPersonActive(db: TidewrightDB, actor: PeopleActor, personId: string, active: boolean, now = new Date()): PeopleResult {
  return db.transaction((tx) => {
    const t = tx as unknown as TidewrightDB
    const person = findPerson(t, actor.organisationId, personId)
    if (!person) return notFound
    if (person.active === active) return { ok: true, person, changed: false }
    if (!active && person.id === actor.id) return refuse('You cannot deactivate your own account; ask another admin.')
    if (!active && person.role === 'admin' && activeAdminCount(t, actor.organisationId) <= 1) return refuse(lastAdminMessage(person.name))
    const updated = t.update(users).set({ active, updatedAt: now.toISOString() }).where(eq(users.id, person.id)).returning().get()
    if (!active) {
      // Links already e-mailed (reset, invitation) stop working with the account.
      t.update(authTokens).set({ usedAt: now.toISOString() }).where(and(eq(authTokens.userId, person.id), isNull(authTokens.usedAt))).run()
    }
    appendAudit(t, actor, { action: active ? 'user.reactivate' : 'user.deactivate', entity: 'user', entityId: person.id, before: { active: person.active }, after: { active } }, now)
    return { ok: true, person: updated, changed: true }
  })
}

/** Whether the actor may handle this person's invitation or reset: admins anyone's, aquarists clients' only. */
export function mayHandleAccountOf(actor: PeopleActor, person: Pick<Person, 'role'>): boolean {
  return actor.role === 'admin' || (actor.role === 'aquarist' && person.role === 'client')
}

/**
 * Withdraws an invitation nobody has accepted yet: the account is removed with its links,
 * so the e-mailed link stops working and the address can be invited again.
 */
export function withdrawInvitation(db: TidewrightDB, actor: PeopleActor, personId: string, now = new Date()): PeopleResult {
  return db.transaction((tx) => {
    const t = tx as unknown as TidewrightDB
    const person = findPerson(t, actor.organisationId, personId)
    if (!person || !mayHandleAccountOf(actor, person)) return notFound
    if (person.passwordHash !== null) return refuse(`${person.name} has already accepted the invitation; deactivate the account instead.`)
    t.delete(users).where(and(eq(users.id, person.id), isNull(users.passwordHash))).run()
    appendAudit(t, actor, { action: 'user.invite-withdraw', entity: 'user', entityId: person.id, before: { name: person.name, email: person.email, role: person.role } }, now)
    return { ok: true, person, changed: true }
  })
}
