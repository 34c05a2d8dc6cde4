/**
 * Reading the company's people: one searchable, paginated list of staff and client
 * accounts with where each stands, and what the admin home flags. Framework-free.
 */
import { and, asc, eq, sql, type SQL } from 'drizzle-orm'
import type { PeopleQuery } from '#shared/schemas/people'
import type { AdminAttention, PeopleList, PersonStatus, PersonView } from '#shared/types/people'
import type { Role } from '#shared/types/roles'
import type { Db } from '#server/db/connection'
import { clients, tanks, users } from '#server/db/schema'

// Columns written out in full: drizzle drops table names in single-table selects, which would break the correlation.
const newestInvite = sql`(select max(t."expires_at") from "auth_tokens" t where t."user_id" = "users"."id" and t."purpose" = 'invite' and t."used_at" is null)`
const invitedAt = sql<string | null>`(select max(t."created_at") from "auth_tokens" t where t."user_id" = "users"."id" and t."purpose" = 'invite')`
// From the sessions table, which keeps a session 30 days after it ends: older sign-ins read as none.
const lastSignIn = sql<string | null>`(select max(s."created_at") from "sessions" s where s."user_id" = "users"."id")`
const openTanks = sql<number>`(select count(*) from "tanks" k where k."archived_at" is null and (k."aquarist_id" = "users"."id" or k."supervisor_id" = "users"."id"))`

/** The status of each account as SQL, so the list can filter and show it alike. */
const statusOf = (now: Date) => sql<PersonStatus>`(case
  when "users"."active" = 0 then 'deactivated'
  when "users"."password_hash" is null then (case when ${newestInvite} > ${now.toISOString()} then 'invited' else 'invitation-expired' end)
  else 'active' end)`

/** Whom the actor may list: an admin everyone, an aquarist the client accounts they may invite. */
function visiblePeople(organisationId: string, actorRole: Role): SQL {
  const inCompany = eq(users.organisationId, organisationId)
  return actorRole === 'admin' ? inCompany : and(inCompany, eq(users.role, 'client'))!
}

/** One page of the company's people, searched by name or e-mail, filtered by role and status, by name. */
export function listPeople(db: Db, actor: { organisationId: string, role: Role }, query: PeopleQuery, now = new Date()): PeopleList {
  const status = statusOf(now)
  const conditions: SQL[] = [visiblePeople(actor.organisationId, actor.role)]
  if (query.q) {
    const pattern = `%${query.q.replace(/[%_\\]/g, m => `\\${m}`)}%`
    conditions.push(sql`(${users.name} like ${pattern} escape '\\' or ${users.email} like ${pattern} escape '\\')`)
  }
  if (query.role) conditions.push(eq(users.role, query.role))
  if (query.status) conditions.push(sql`${status} = ${query.status}`)
  const where = and(...conditions)
  const rows = db.select({
    user: users, status, expiresAt: sql<string | null>`${newestInvite}`, invitedAt, lastSignIn, openTanks, clientName: clients.name,
  }).from(users).leftJoin(clients, eq(clients.id, users.clientId)).where(where)
    .orderBy(asc(sql`lower(${users.name})`), asc(users.id))
    .limit(query.pageSize).offset((query.page - 1) * query.pageSize).all()
  const total = db.select({ n: sql<number>`count(*)` }).from(users).where(where).get()?.n ?? 0
  return {
    items: rows.map((r): PersonView => ({
      id: r.user.id,
      name: r.user.name,
      email: r.user.email,
      role: r.user.role,
      status: r.status,
      units: r.user.units,
      lastSignInAt: r.lastSignIn,
      clientName: r.clientName,
      invitedAt: r.user.passwordHash === null ? r.invitedAt : null,
      invitationExpiresAt: r.user.passwordHash === null ? r.expiresAt : null,
      openTanks: Number(r.openTanks),
    })),
    total: Number(total),
    page: query.page,
    pageSize: query.pageSize,
  }
}

/** A person of the company, or undefined (the route answers 404). */
export function findPerson(db: Db, organisationId: string, personId: string) {
  return db.select().from(users).where(and(eq(users.id, personId), eq(users.organisationId, organisationId))).get()
}

/** Pending invitations, deactivated people still on open tanks, and tanks with no aquarist. */
export function adminAttention(db: Db, organisationId: string, now = new Date()): AdminAttention {
  const status = statusOf(now)
  const pending = db.select({ id: users.id, name: users.name, email: users.email, role: users.role, status, invitedAt })
    .from(users).where(and(eq(users.organisationId, organisationId), eq(users.active, true), sql`${users.passwordHash} is null`))
    .orderBy(asc(sql`lower(${users.name})`)).all()
  const deactivated = db.select({ id: users.id, name: users.name, role: users.role, openTanks })
    .from(users).where(and(eq(users.organisationId, organisationId), eq(users.active, false), sql`${openTanks} > 0`))
    .orderBy(asc(sql`lower(${users.name})`)).all()
  const unassigned = db.select({ id: tanks.id, name: tanks.name, clientName: clients.name, status: tanks.status })
    .from(tanks).innerJoin(clients, eq(clients.id, tanks.clientId))
    .where(and(eq(tanks.organisationId, organisationId), sql`${tanks.archivedAt} is null`, sql`${tanks.aquaristId} is null`))
    .orderBy(asc(tanks.name)).all()
  return {
    pendingInvitations: pending.map(p => ({ id: p.id, name: p.name, email: p.email, role: p.role, expired: p.status === 'invitation-expired', invitedAt: p.invitedAt })),
    deactivatedWithTanks: deactivated.map(d => ({ ...d, openTanks: Number(d.openTanks) })),
    unassignedTanks: unassigned,
  }
}
