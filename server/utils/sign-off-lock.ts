/**
 * The locked record: once a tank is signed off, readings and events up to the sign-off
 * time are part of what the supervisor signed and cannot be edited or deleted; a mistake
 * is corrected by a new, linked entry with a reason. Every route that changes or removes
 * a reading or event (or writes one back-dated into the signed period) calls
 * assertEntryUnlocked first.
 */
import { and, desc, eq, sql } from 'drizzle-orm'
import { signOffs } from '../db/schema'
import { preparedPerDb } from '../db/prepared'
import { isSignedStage, signedEntryIds } from '../domain/sign-off/signed-record'

/** The tank's current approved sign-off (not reopened), if there is one. */
export function currentApprovedSignOff(tankId: string) {
  return useDB().select().from(signOffs)
    .where(and(eq(signOffs.tankId, tankId), eq(signOffs.status, 'approved')))
    .orderBy(desc(signOffs.decidedAt)).get()
}

// Only the decision time, prepared once: every history page asks it, and the snapshot is large.
const approvedDecisionTime = preparedPerDb(db => db.select({ decidedAt: signOffs.decidedAt }).from(signOffs)
  .where(and(eq(signOffs.tankId, sql.placeholder('tankId')), eq(signOffs.status, 'approved')))
  .orderBy(desc(signOffs.decidedAt)).limit(1).prepare())

/** The time up to which the tank's readings and events are locked, or null when nothing is signed. */
export function lockedUntil(tankId: string): string | null {
  return approvedDecisionTime(useDB()).get({ tankId })?.decidedAt ?? null
}

/**
 * Throws 409 when an entry lies inside the signed-off record of the tank: taken at or
 * before the decision, or held in the decision's snapshot whatever its date. Call it with
 * the entry's stored time and id before an edit or delete, and with the new time when an
 * edit or a new entry would move into that period.
 */
export function assertEntryUnlocked(tankId: string, entryTime: string | Date, entryId?: string): void {
  const signed = currentApprovedSignOff(tankId)
  const until = signed?.decidedAt
  if (!until) return
  const at = entryTime instanceof Date ? entryTime.getTime() : Date.parse(entryTime)
  const inSnapshot = entryId !== undefined && signedEntryIds(signed.snapshot).has(entryId)
  if (Number.isNaN(at) || at <= Date.parse(until) || inSnapshot) {
    const message = `This entry falls in the period signed off on ${until.slice(0, 10)} and can no longer be changed. Add a correction with a reason instead; a supervisor can reopen the sign-off if needed.`
    throw createError({ statusCode: 409, statusMessage: message, message, data: { lockedUntil: until } })
  }
}

/** Throws 409 when the stage was finished in the current sign-off's record: it changes only after reopening. */
export function assertStageUnsigned(tankId: string, stageKey: string): void {
  const signed = currentApprovedSignOff(tankId)
  if (!signed || !isSignedStage(signed.snapshot, stageKey)) return
  const message = `This stage is part of the record signed off on ${signed.decidedAt?.slice(0, 10)}. A supervisor can reopen the sign-off if it must change.`
  throw createError({ statusCode: 409, statusMessage: message, message })
}
