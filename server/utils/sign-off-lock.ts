/**
 * The locked record: once a tank is signed off, readings and events up to the sign-off
 * time are part of what the supervisor signed and cannot be edited or deleted; a mistake
 * is corrected by a new, linked entry with a reason. Every route that changes or removes
 * a reading or event (or writes one back-dated into the signed period) calls
 * assertEntryUnlocked first.
 */
import { and, desc, eq } from 'drizzle-orm'
import { signOffs } from '../db/schema'

/** The tank's current approved sign-off (not reopened), if there is one. */
export function currentApprovedSignOff(tankId: string) {
  return useDB().select().from(signOffs)
    .where(and(eq(signOffs.tankId, tankId), eq(signOffs.status, 'approved')))
    .orderBy(desc(signOffs.decidedAt)).get()
}

/** The time up to which the tank's readings and events are locked, or null when nothing is signed. */
export function lockedUntil(tankId: string): string | null {
  return currentApprovedSignOff(tankId)?.decidedAt ?? null
}

/**
 * Throws 409 when an entry taken at `entryTime` lies inside the signed-off period of the
 * tank. Call it with the entry's stored time before an edit or delete, and with the new
 * time when an edit or a new entry would move into that period.
 */
export function assertEntryUnlocked(tankId: string, entryTime: string | Date): void {
  const until = lockedUntil(tankId)
  if (!until) return
  const at = entryTime instanceof Date ? entryTime.getTime() : Date.parse(entryTime)
  if (Number.isNaN(at) || at <= Date.parse(until)) {
    const message = `This entry falls in the period signed off on ${until.slice(0, 10)} and can no longer be changed. Add a correction with a reason instead; a supervisor can reopen the sign-off if needed.`
    throw createError({ statusCode: 409, statusMessage: message, message, data: { lockedUntil: until } })
  }
}
