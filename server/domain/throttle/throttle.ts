/**
 * Counting attempts per key in a time window, framework-free. An attempt is reserved
 * (its mark written) in one IMMEDIATE transaction BEFORE the slow or costly work it
 * guards, so requests sent together cannot all pass the check before any is counted.
 * Keys name what is counted: `sign-in:account:<e-mail>`, `reset-mail:network:<ip group>`, ...
 */
import { and, eq, gte, inArray, lt, sql } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { throttleMarks } from '#server/db/schema'

export interface ThrottleLimit {
  key: string
  /** Attempts allowed in the window. */
  max: number
  windowMs: number
}

export type Reservation
  = | { granted: true, markIds: number[], counts: number[] }
    | { granted: false, refusedBy: ThrottleLimit, retryAfterSeconds: number, counts: number[] }

function countSince(db: Db, key: string, since: string): number {
  return db.select({ n: sql<number>`count(*)` }).from(throttleMarks)
    .where(and(eq(throttleMarks.key, key), gte(throttleMarks.at, since))).get()?.n ?? 0
}

/**
 * Reserves one attempt under every limit, or none: if any limit is full nothing is
 * written and the first full limit is named. `counts` are the attempts already made.
 */
export function reserveAttempt(db: Db, limits: readonly ThrottleLimit[], now: Date): Reservation {
  return db.transaction((t) => {
    const counts = limits.map(limit => countSince(t, limit.key, new Date(now.getTime() - limit.windowMs).toISOString()))
    const full = limits.findIndex((limit, i) => counts[i]! >= limit.max)
    if (full >= 0) {
      const limit = limits[full]!
      return { granted: false as const, refusedBy: limit, retryAfterSeconds: Math.ceil(limit.windowMs / 1000), counts }
    }
    const at = now.toISOString()
    const markIds = limits.map(limit => t.insert(throttleMarks).values({ key: limit.key, at }).returning({ id: throttleMarks.id }).get().id)
    return { granted: true as const, markIds, counts }
  }, { behavior: 'immediate' })
}

/** Gives reserved attempts back (the attempt turned out not to count, e.g. a correct password). */
export function releaseAttempt(db: Db, markIds: readonly number[]): void {
  if (markIds.length) db.delete(throttleMarks).where(inArray(throttleMarks.id, [...markIds])).run()
}

/** Forgets every attempt under a key (a successful sign-in clears its account's record). */
export function clearAttempts(db: Db, key: string): void {
  db.delete(throttleMarks).where(eq(throttleMarks.key, key)).run()
}

/** Deletes marks older than the longest window in use; returns how many. */
export function pruneAttempts(db: Db, olderThan: Date): number {
  return db.delete(throttleMarks).where(lt(throttleMarks.at, olderThan.toISOString())).run().changes
}
