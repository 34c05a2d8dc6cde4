/**
 * Server-side sessions, framework-free: the cookie names a row here and the row decides.
 * Every way a session ends (sign-out, password reset, deactivation, role change, the
 * person ending it, a lifetime running out) is one UPDATE of `ended_at`, never a delete,
 * so a replayed cookie finds an ended row and is refused.
 */
import { createHash, randomBytes } from 'node:crypto'
import { and, desc, eq, gt, isNull, lt, ne, or, sql } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import { sessions } from '#server/db/schema'
import { addressGroup } from '#server/domain/net/address-group'

export const SESSION_END_REASONS = [
  'signed-out', 'ended-by-person', 'password-reset', 'deactivated', 'role-changed', 'idle', 'expired',
] as const
export type SessionEndReason = typeof SESSION_END_REASONS[number]

export interface SessionLifetimes {
  /** A session unused this long ends. */
  idleMs: number
  /** A session ends this long after sign-in, used or not. */
  absoluteMs: number
}

/** How often a session's last-seen time is written: reads stay reads most of the time. */
const TOUCH_EVERY_MS = 60_000
/** Ended and expired rows are kept this long for the person's record, then pruned. */
const KEEP_ENDED_MS = 30 * 86_400_000

export type SessionRow = typeof sessions.$inferSelect

/** The stored form of a cookie token: SHA-256, hex. */
export function hashSessionToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

/** Opens a session; returns the token the sealed cookie carries (256 random bits) and the row id. */
export function startSession(db: Db, input: { userId: string, now: Date, lifetimes: SessionLifetimes, userAgent?: string | null, address?: string | null }): { token: string, id: string } {
  const token = randomBytes(32).toString('base64url')
  const at = input.now.toISOString()
  const row = db.insert(sessions).values({
    id: randomBytes(16).toString('base64url'),
    userId: input.userId,
    tokenHash: hashSessionToken(token),
    createdAt: at,
    lastSeenAt: at,
    expiresAt: new Date(input.now.getTime() + input.lifetimes.absoluteMs).toISOString(),
    userAgent: summariseUserAgent(input.userAgent),
    address: input.address ? addressGroup(input.address) : null,
  }).returning({ id: sessions.id }).get()
  return { token, id: row.id }
}

/** The session row with this token hash: asked on every signed-in request. */
const sessionByTokenHash = preparedPerDb(db =>
  db.select().from(sessions).where(eq(sessions.tokenHash, sql.placeholder('tokenHash'))).prepare())

export type SessionCheck
  = | { live: true, session: SessionRow }
    | { live: false, reason: 'unknown' | 'ended' | SessionEndReason }

/**
 * A token's session as read at `now`: either the check itself, when checking it writes nothing
 * (most checks: they only read), or the write the check is due (its end, or its last-seen time).
 */
export type SessionAsRead
  = | { write: null, check: SessionCheck }
    | { write: SessionWrite, session: SessionRow }

/** What checking a live session may write: its end (a lifetime ran out) or its last-seen time. */
export type SessionWrite = 'expired' | 'idle' | 'touch'

/**
 * The token's session as read now, and what checking it at `now` would write. A check that
 * writes nothing ends here; one that writes reads again under the write lock (checkSession).
 */
export function readSession(db: Db, token: string, now: Date, lifetimes: SessionLifetimes): SessionAsRead {
  const row = sessionByTokenHash(db).get({ tokenHash: hashSessionToken(token) })
  if (!row) return { write: null, check: { live: false, reason: 'unknown' } }
  if (row.endedAt) return { write: null, check: { live: false, reason: 'ended' } }
  const write = writeDue(row, now, lifetimes)
  return write ? { write, session: row } : { write: null, check: { live: true, session: row } }
}

/**
 * The session behind a cookie token at `now`, with what the check writes. A session past its
 * idle or absolute lifetime is ended here, so it stays ended even if the clock is later read
 * differently.
 */
export function checkSession(db: Db, token: string, now: Date, lifetimes: SessionLifetimes): SessionCheck {
  const read = readSession(db, token, now, lifetimes)
  if (read.write === null) return read.check
  if (read.write !== 'touch') {
    endSession(db, read.session.id, read.write, now)
    return { live: false, reason: read.write }
  }
  db.update(sessions).set({ lastSeenAt: now.toISOString() }).where(eq(sessions.id, read.session.id)).run()
  return { live: true, session: read.session }
}

/** What checking this live session at `now` writes: its end (a lifetime ran out), its last-seen time, or nothing. */
function writeDue(row: SessionRow, now: Date, lifetimes: SessionLifetimes): SessionWrite | null {
  const at = now.getTime()
  if (at >= Date.parse(row.expiresAt)) return 'expired'
  const unused = at - Date.parse(row.lastSeenAt)
  if (unused >= lifetimes.idleMs) return 'idle'
  return unused >= TOUCH_EVERY_MS ? 'touch' : null
}

/** Ends one session; true if it was live. */
export function endSession(db: Db, sessionId: string, reason: SessionEndReason, now = new Date()): boolean {
  const done = db.update(sessions).set({ endedAt: now.toISOString(), endReason: reason })
    .where(and(eq(sessions.id, sessionId), isNull(sessions.endedAt))).run()
  return done.changes > 0
}

/** Ends the live session with this cookie token, if any (sign-out). */
export function endSessionByToken(db: Db, token: string, reason: SessionEndReason, now = new Date()): void {
  db.update(sessions).set({ endedAt: now.toISOString(), endReason: reason })
    .where(and(eq(sessions.tokenHash, hashSessionToken(token)), isNull(sessions.endedAt))).run()
}

/**
 * Ends every live session of a person at once, except (optionally) one: used by password
 * reset, deactivation, role change and "end all my other sessions". Returns how many ended.
 */
export function endSessionsOfUser(db: Db, userId: string, options: { except?: string, reason?: SessionEndReason, now?: Date } = {}): number {
  const conditions = [eq(sessions.userId, userId), isNull(sessions.endedAt)]
  if (options.except) conditions.push(ne(sessions.id, options.except))
  const done = db.update(sessions)
    .set({ endedAt: (options.now ?? new Date()).toISOString(), endReason: options.reason ?? 'ended-by-person' })
    .where(and(...conditions)).run()
  return done.changes
}

/** A person's sessions that are still live at `now`, newest activity first. */
export function liveSessionsOfUser(db: Db, userId: string, now: Date, lifetimes: SessionLifetimes): SessionRow[] {
  const idleSince = new Date(now.getTime() - lifetimes.idleMs).toISOString()
  return db.select().from(sessions).where(and(
    eq(sessions.userId, userId),
    isNull(sessions.endedAt),
    gt(sessions.expiresAt, now.toISOString()),
    gt(sessions.lastSeenAt, idleSince),
  )).orderBy(desc(sessions.lastSeenAt)).all()
}

/** Deletes sessions ended or expired more than 30 days ago; returns how many. */
export function pruneSessions(db: Db, now = new Date()): number {
  const before = new Date(now.getTime() - KEEP_ENDED_MS).toISOString()
  return db.delete(sessions).where(or(lt(sessions.endedAt, before), lt(sessions.expiresAt, before))).run().changes
}

/** "Firefox on Linux"-style summary: enough for a person to recognise a device, no fingerprint kept. */
export function summariseUserAgent(userAgent: string | null | undefined): string | null {
  if (!userAgent) return null
  const browser = /Edg\//.test(userAgent)
    ? 'Edge'
    : /Firefox\//.test(userAgent)
      ? 'Firefox'
      : /Chrome\/|Chromium\//.test(userAgent) ? 'Chrome' : /Safari\//.test(userAgent) ? 'Safari' : null
  const system = /iPhone|iPad/.test(userAgent)
    ? 'iOS'
    : /Android/.test(userAgent)
      ? 'Android'
      : /Mac OS X/.test(userAgent) ? 'macOS' : /Windows/.test(userAgent) ? 'Windows' : /Linux/.test(userAgent) ? 'Linux' : null
  if (browser && system) return `${browser} on ${system}`
  return browser ?? system ?? userAgent.slice(0, 60)
}
