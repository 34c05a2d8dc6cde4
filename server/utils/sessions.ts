/**
 * Nitro glue for server-side sessions (server/domain/sessions): the sealed nuxt-auth-utils
 * cookie carries only `secure.sessionToken`; who the person is comes from the database on
 * every request. Lifetimes from runtimeConfig.sessionLifetime (NUXT_SESSION_LIFETIME_*).
 */
import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import { accountUsable } from '#server/domain/people/people'
import { checkSession, startSession, type SessionLifetimes } from '#server/domain/sessions/sessions'
import { clients, users } from '#server/db/schema'

type UserRow = typeof users.$inferSelect

/** Idle and absolute lifetimes from the runtime config. */
export function sessionLifetimes(): SessionLifetimes {
  const { idleMinutes, absoluteMinutes } = useRuntimeConfig().sessionLifetime
  return { idleMs: Number(idleMinutes) * 60_000, absoluteMs: Number(absoluteMinutes) * 60_000 }
}

/** The address a request came from: the socket's, or X-Forwarded-For only when a trusted proxy is configured (NUXT_TRUST_PROXY). */
export function clientAddress(event: H3Event): string | null {
  return getRequestIP(event, { xForwardedFor: isOn(useRuntimeConfig().trustProxy) }) ?? null
}

/** Opens a server-side session for the user and seals its token into the cookie (replacing any older one). */
export async function signInAs(event: H3Event, user: Pick<UserRow, 'id'>): Promise<void> {
  const { token } = startSession(useDB(), {
    userId: user.id,
    now: requestNow(event),
    lifetimes: sessionLifetimes(),
    userAgent: getHeader(event, 'user-agent'),
    address: clientAddress(event),
  })
  await replaceUserSession(event, { secure: { sessionToken: token } })
}

/** Whether the request brought a session cookie at all (asking for the session without one would create one). */
export function hasSessionCookie(event: H3Event): boolean {
  return Boolean(getCookie(event, useRuntimeConfig().session.name ?? 'nuxt-session'))
}

/** The token in the request's sealed cookie, without creating a session when there is no cookie. */
export async function sessionTokenOf(event: H3Event): Promise<string | null> {
  if (!hasSessionCookie(event)) return null
  const session = await getUserSession(event)
  return session.secure?.sessionToken ?? null
}

export interface SignedIn {
  sessionId: string
  user: UserRow
}

/**
 * The live session and its person, or null: no cookie, an unknown, ended or lapsed session,
 * a deactivated person, or a client whose client record is archived.
 */
export async function resolveSignedIn(event: H3Event): Promise<SignedIn | null> {
  const token = await sessionTokenOf(event)
  if (!token) return null
  const db = useDB()
  const check = checkSession(db, token, requestNow(event), sessionLifetimes())
  if (!check.live) return null
  const row = db.select({ user: users, clientArchivedAt: clients.archivedAt }).from(users)
    .leftJoin(clients, eq(clients.id, users.clientId))
    .where(eq(users.id, check.session.userId)).get()
  if (!row || !accountUsable(row.user, row.clientArchivedAt)) return null
  return { sessionId: check.session.id, user: row.user }
}
