/**
 * Nitro glue for server-side sessions (server/domain/sessions): the sealed nuxt-auth-utils
 * cookie carries only `secure.sessionToken`; who the person is comes from the database on
 * every request. Lifetimes from runtimeConfig.sessionLifetime (NUXT_SESSION_LIFETIME_*).
 */
import type { H3Event } from 'h3'
import { accountUsable, personWithClientArchive } from '#server/domain/people/people'
import { checkSession, readSession, startSession, type SessionCheck, type SessionLifetimes } from '#server/domain/sessions/sessions'
import { UnsealedCookies } from '#server/domain/sessions/unsealed-cookies'
import type { users } from '#server/db/schema'

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
  const { token } = await writeTransaction(db => startSession(db, {
    userId: user.id,
    now: requestNow(event),
    lifetimes: sessionLifetimes(),
    userAgent: getHeader(event, 'user-agent'),
    address: clientAddress(event),
  }))
  await replaceUserSession(event, { secure: { sessionToken: token } })
}

/** The session cookie's name (runtimeConfig.session.name). */
function sessionCookieName(): string {
  return useRuntimeConfig().session.name ?? 'nuxt-session'
}

/** Whether the request brought a session cookie at all (asking for the session without one would create one). */
export function hasSessionCookie(event: H3Event): boolean {
  return Boolean(getCookie(event, sessionCookieName()))
}

/**
 * What each sealed cookie opened to, for a minute: unsealing is PBKDF2 + AES, the largest
 * cost of a read. Safe because the session row and the person are still read on every
 * request (see server/domain/sessions/unsealed-cookies.ts); the cap bounds the memory.
 */
const unsealedCookies = new UnsealedCookies({ ttlMs: 60_000, maxEntries: 10_000 })

/** Forgets the cookie this request brought (its session has ended or is being cleared). */
export function forgetSessionCookie(event: H3Event, token?: string | null): void {
  const sealed = getCookie(event, sessionCookieName())
  if (sealed) unsealedCookies.forgetCookie(sealed)
  if (token) unsealedCookies.forgetToken(token)
}

/**
 * The token in the request's sealed cookie, without creating a session when there is no
 * cookie. A cookie opened within the last minute is not opened again. A request that sends
 * the session as a header instead (h3 prefers it to the cookie) is always unsealed.
 */
export async function sessionTokenOf(event: H3Event): Promise<string | null> {
  const name = sessionCookieName()
  const sealed = getCookie(event, name)
  if (!sealed) return null
  const viaHeader = getHeader(event, `x-${name.toLowerCase()}-session`) !== undefined
  const now = Date.now()
  if (!viaHeader) {
    const known = unsealedCookies.tokenOf(sealed, now)
    if (known) return known
  }
  const session = await getUserSession(event)
  const token = session.secure?.sessionToken ?? null
  if (token && !viaHeader) unsealedCookies.remember(sealed, token, now, sealExpiresAt(event, name))
  return token
}

/** When the seal just opened stops being accepted by h3 (its createdAt + session maxAge), epoch ms; null when unlimited. */
function sealExpiresAt(event: H3Event, name: string): number | null {
  const maxAgeSeconds = Number(useRuntimeConfig().session.maxAge)
  const createdAt = (event.context.sessions as Record<string, { createdAt?: number }> | undefined)?.[name]?.createdAt
  if (!maxAgeSeconds) return null
  return typeof createdAt === 'number' ? createdAt + maxAgeSeconds * 1000 : Date.now()
}

/**
 * checkSession, with the write lock as its write needs it. Most checks only read. One that ends
 * the session waits for the lock off the loop: an ended session must not be let in. The
 * once-a-minute touch is written only if the lock is free at once; otherwise the read goes on
 * untouched (a CSV import holds the lock for up to a second) and a later request touches it.
 */
async function checkedSession(token: string, now: Date, lifetimes: SessionLifetimes): Promise<SessionCheck> {
  const db = useDB()
  const read = readSession(db, token, now, lifetimes)
  if (read.write === null) return read.check
  // Read again under the lock: the session may have changed while the lock was waited for.
  if (read.write !== 'touch') return writeTransaction(tx => checkSession(tx, token, now, lifetimes))
  // Lock busy: the session is live as just read, and a later request writes its last-seen time.
  return await writeIfFree(tx => checkSession(tx, token, now, lifetimes)) ?? { live: true, session: read.session }
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
  const now = requestNow(event)
  const lifetimes = sessionLifetimes()
  const check = await checkedSession(token, now, lifetimes)
  if (!check.live) {
    forgetSessionCookie(event, token)
    return null
  }
  const row = personWithClientArchive(db, check.session.userId)
  if (!row || !accountUsable(row.user, row.clientArchivedAt)) {
    forgetSessionCookie(event, token)
    return null
  }
  return { sessionId: check.session.id, user: row.user }
}
