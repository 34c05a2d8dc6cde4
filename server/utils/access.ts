/**
 * Who may see what, written once. Every route starts with requireActor; every query on
 * tank-owned data goes through visibleTankCondition or findVisibleTank, so a row outside
 * the actor's organisation (or, for a client, outside their own tanks) is simply not found.
 */
import { and, eq, isNull, sql, type SQL } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { Role, UnitSystem } from '#shared/vocabulary'
import { tanks } from '#server/db/schema'
import { preparedPerDb } from '#server/db/prepared'

export interface Actor {
  id: string
  name: string
  role: Role
  organisationId: string
  /** The client record a client account belongs to; null for staff. */
  clientId: string | null
  units: UnitSystem
  /** The server-side session this request came with. */
  sessionId: string
}

/**
 * 401 when signed out, 403 when the role may not use the route. The session row and the
 * person are read on every request, so a session ended anywhere (sign-out, reset,
 * deactivation, role change, an archived client record, a lifetime running out) stops at once.
 */
export async function requireActor(event: H3Event, roles?: readonly Role[]): Promise<Actor> {
  const signedIn = await resolveSignedIn(event)
  if (!signedIn) {
    // Only a request that brought a cookie gets the cookie cleared; otherwise asking for
    // the session would create an empty one and send a fresh cookie with every 401.
    if (hasSessionCookie(event)) await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Sign in to continue' })
  }
  const row = signedIn.user
  if (roles && !roles.includes(row.role)) throw createError({ statusCode: 403, statusMessage: 'Your role may not do this' })
  return {
    id: row.id,
    name: row.name,
    role: row.role,
    organisationId: row.organisationId,
    clientId: row.role === 'client' ? row.clientId : null,
    units: row.units,
    sessionId: signedIn.sessionId,
  }
}

/** The WHERE condition for tanks the actor may see. A client without a client record sees none. */
export function visibleTankCondition(actor: Actor): SQL {
  const inOrganisation = and(eq(tanks.organisationId, actor.organisationId), isNull(tanks.archivedAt))!
  if (actor.role !== 'client') return inOrganisation
  return and(inOrganisation, eq(tanks.clientId, actor.clientId ?? '\u0000'))!
}

/**
 * visibleTankCondition with its values as placeholders (`organisationId`, and `clientId` for
 * a client), so the hottest scoped queries can be prepared once: staff and client each get
 * their own statement, and which one runs is chosen by `preparedFor`.
 */
export const visibleTankPlaceholders = {
  staff: and(eq(tanks.organisationId, sql.placeholder('organisationId')), isNull(tanks.archivedAt))!,
  client: and(eq(tanks.organisationId, sql.placeholder('organisationId')), isNull(tanks.archivedAt), eq(tanks.clientId, sql.placeholder('clientId')))!,
}

/** The values visibleTankPlaceholders binds for this actor (a client without a client record matches no tank). */
export function visibleTankValues(actor: Actor): { organisationId: string, clientId: string } {
  return { organisationId: actor.organisationId, clientId: actor.clientId ?? '\u0000' }
}

/** Which of two prepared variants (built with visibleTankPlaceholders.staff / .client) serves this actor. */
export function preparedFor<T>(actor: Actor, variants: { staff: T, client: T }): T {
  return actor.role === 'client' ? variants.client : variants.staff
}

const visibleTankById = preparedPerDb(db => ({
  staff: db.select().from(tanks).where(and(eq(tanks.id, sql.placeholder('tankId')), visibleTankPlaceholders.staff)).prepare(),
  client: db.select().from(tanks).where(and(eq(tanks.id, sql.placeholder('tankId')), visibleTankPlaceholders.client)).prepare(),
}))

/** The tank row if the actor may see it, else undefined (the route answers 404). */
export function findVisibleTank(actor: Actor, tankId: string) {
  return preparedFor(actor, visibleTankById(useDB())).get({ tankId, ...visibleTankValues(actor) })
}

/** Like findVisibleTank but throws the 404 itself. */
export function requireVisibleTank(actor: Actor, tankId: string) {
  const tank = findVisibleTank(actor, tankId)
  if (!tank) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  return tank
}

/** Staff who may change a tank: admins and aquarists of its organisation. */
export function canManageTank(actor: Actor, tank: { organisationId: string }): boolean {
  return tank.organisationId === actor.organisationId && (actor.role === 'admin' || actor.role === 'aquarist')
}
