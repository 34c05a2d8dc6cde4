/**
 * The locked record, framework-free: once a tank is signed off, readings and events up to
 * the sign-off time, and the stages finished in it, are part of what the supervisor signed.
 * These say whether a change would touch it; server/utils/sign-off-lock.ts answers 409.
 */
import { and, desc, eq, sql } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import { signOffs } from '#server/db/schema'
import { currentApprovedSignOff } from './records'
import { isSignedStage, signedInputHolds } from './signed-record'

/** The current approval's id and decision time, prepared once: every history page and every save on a signed tank asks it, and reads no snapshot. */
const approvedDecision = preparedPerDb(db => db.select({ id: signOffs.id, decidedAt: signOffs.decidedAt }).from(signOffs)
  .where(and(eq(signOffs.tankId, sql.placeholder('tankId')), eq(signOffs.status, 'approved')))
  .orderBy(desc(signOffs.decidedAt)).limit(1).prepare())

/** The time up to which the tank's readings and events are locked, or null when nothing is signed. */
export function lockedUntil(db: Db, tankId: string): string | null {
  return approvedDecision(db).get({ tankId })?.decidedAt ?? null
}

/**
 * Why an entry may not change: it was taken at or before the decision, or the input the decision
 * was made from holds it whatever its date. Null when it lies outside the signed record. Ask with
 * the entry's stored time and id before an edit or delete, and with the new time when an
 * edit or a new entry would move into that period.
 */
export function entryLockRefusal(db: Db, tankId: string, entryTime: string | Date, entryId?: string): { message: string, lockedUntil: string } | null {
  const signed = approvedDecision(db).get({ tankId })
  const until = signed?.decidedAt
  if (!until) return null
  const at = entryTime instanceof Date ? entryTime.getTime() : Date.parse(entryTime)
  const afterDecision = !Number.isNaN(at) && at > Date.parse(until)
  // The signed input is asked (in SQL) only for an entry dated after the decision: one before it is locked anyway.
  if (afterDecision && (entryId === undefined || !signedInputHolds(db, signed.id, entryId))) return null
  return {
    message: `This entry falls in the period signed off on ${until.slice(0, 10)} and can no longer be changed. Add a correction with a reason instead; a supervisor can reopen the sign-off if needed.`,
    lockedUntil: until,
  }
}

/** Why a stage may not change: it was finished in the current sign-off's record and changes only after reopening. Null otherwise. */
export function stageLockRefusal(db: Db, tankId: string, stageKey: string): string | null {
  const signed = currentApprovedSignOff(db, tankId)
  if (!signed || !isSignedStage(signed.snapshot, stageKey)) return null
  return `This stage is part of the record signed off on ${signed.decidedAt?.slice(0, 10)}. A supervisor can reopen the sign-off if it must change.`
}
