/**
 * A company's people, framework-free: deactivation, reactivation and role changes. Each
 * ends the person's sessions and writes its audit row in the same transaction, and none
 * may leave the company without an active admin.
 */
import { and, eq, ne, sql } from 'drizzle-orm'
import type { StaffRole } from '#shared/vocabulary'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import { clients, users } from '#server/db/schema'
import { recordAudit, type AuditWho } from '#server/domain/audit/record'
import { endSessionsOfUser } from '#server/domain/sessions/sessions'

export interface PersonView {
  id: string
  name: string
  email: string
  role: typeof users.$inferSelect.role
  active: boolean
}

/** Why a change to a person was refused; the route turns it into a 404 or 409. */
export class PersonChangeRefused extends Error {
  constructor(readonly status: 404 | 409, message: string) {
    super(message)
  }
}

type Actor = AuditWho & { id: string }

/**
 * Whether an account may be used at all: it is active and, for a client account, its client
 * record is not archived (restoring the record brings the account back). Sign-in and every
 * request ask this same question.
 */
export function accountUsable(user: Pick<typeof users.$inferSelect, 'active' | 'role'>, clientArchivedAt: string | null | undefined): boolean {
  return user.active && !(user.role === 'client' && clientArchivedAt)
}

const personWithClientRecord = preparedPerDb(db =>
  db.select({ user: users, clientArchivedAt: clients.archivedAt }).from(users)
    .leftJoin(clients, eq(clients.id, users.clientId))
    .where(eq(users.id, sql.placeholder('userId'))).prepare())

/** A person as they are now, with their client record's archive time: what every request's `accountUsable` check reads. */
export function personWithClientArchive(db: Db, userId: string): { user: typeof users.$inferSelect, clientArchivedAt: string | null } | undefined {
  return personWithClientRecord(db).get({ userId })
}

/** The archive time of a client account's client record (null for staff and live records). */
export function clientArchivedAt(db: Db, user: Pick<typeof users.$inferSelect, 'clientId'>): string | null {
  if (!user.clientId) return null
  return db.select({ archivedAt: clients.archivedAt }).from(clients).where(eq(clients.id, user.clientId)).get()?.archivedAt ?? null
}

function toView(row: typeof users.$inferSelect): PersonView {
  return { id: row.id, name: row.name, email: row.email, role: row.role, active: row.active }
}

function findPerson(db: Db, actor: Actor, personId: string) {
  const row = db.select().from(users).where(and(eq(users.id, personId), eq(users.organisationId, actor.organisationId))).get()
  if (!row) throw new PersonChangeRefused(404, 'Person not found')
  return row
}

function otherActiveAdmins(db: Db, organisationId: string, personId: string): number {
  return db.select({ n: sql<number>`count(*)` }).from(users).where(and(
    eq(users.organisationId, organisationId), eq(users.role, 'admin'), eq(users.active, true), ne(users.id, personId),
  )).get()?.n ?? 0
}

const LAST_ADMIN = 'The company needs at least one active admin. Make someone else an admin first.'

/** Deactivates a person: they cannot sign in, and every session of theirs ends now. */
export function deactivatePerson(db: Db, actor: Actor, personId: string, now = new Date()): PersonView {
  return db.transaction((t) => {
    const before = findPerson(t, actor, personId)
    if (before.id === actor.id) throw new PersonChangeRefused(409, 'You cannot deactivate your own account. Ask another admin.')
    if (before.role === 'admin' && otherActiveAdmins(t, actor.organisationId, personId) === 0) throw new PersonChangeRefused(409, LAST_ADMIN)
    if (!before.active) return toView(before)
    const after = t.update(users).set({ active: false }).where(eq(users.id, personId)).returning().get()
    const ended = endSessionsOfUser(t, personId, { reason: 'deactivated', now })
    recordAudit(t, actor, { action: 'user.deactivate', entity: 'user', entityId: personId, before: toView(before), after: { ...toView(after), sessionsEnded: ended } })
    return toView(after)
  })
}

/** Lets a deactivated person sign in again (their old sessions stay ended). */
export function reactivatePerson(db: Db, actor: Actor, personId: string): PersonView {
  return db.transaction((t) => {
    const before = findPerson(t, actor, personId)
    if (before.active) return toView(before)
    const after = t.update(users).set({ active: true }).where(eq(users.id, personId)).returning().get()
    recordAudit(t, actor, { action: 'user.reactivate', entity: 'user', entityId: personId, before: toView(before), after: toView(after) })
    return toView(after)
  })
}

/**
 * Moves a staff member to another staff role and ends their sessions, so the new role
 * applies from their next sign-in everywhere. Client accounts keep their role.
 */
export function changePersonRole(db: Db, actor: Actor, personId: string, role: StaffRole, now = new Date()): PersonView {
  return db.transaction((t) => {
    const before = findPerson(t, actor, personId)
    if (before.role === role) return toView(before)
    if (before.role === 'client') throw new PersonChangeRefused(409, 'A client account keeps its role. Invite the person as staff with another address.')
    if (before.role === 'admin' && before.active && otherActiveAdmins(t, actor.organisationId, personId) === 0) throw new PersonChangeRefused(409, LAST_ADMIN)
    const after = t.update(users).set({ role }).where(eq(users.id, personId)).returning().get()
    const ended = endSessionsOfUser(t, personId, { reason: 'role-changed', now })
    recordAudit(t, actor, { action: 'user.role-change', entity: 'user', entityId: personId, before: toView(before), after: { ...toView(after), sessionsEnded: ended } })
    return toView(after)
  })
}
