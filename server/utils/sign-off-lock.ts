/**
 * Nitro glue for the locked record (server/domain/sign-off/lock.ts): every route that
 * changes or removes a reading or event (or writes one back-dated into the signed period),
 * or changes a signed stage, calls these first and gets a 409.
 */
import { currentApprovedSignOff as approvedInDb } from '#server/domain/sign-off/records'
import { entryLockRefusal, lockedUntil as lockedUntilInDb, stageLockRefusal } from '#server/domain/sign-off/lock'

/** The tank's current approved sign-off (not reopened), if there is one. */
export function currentApprovedSignOff(tankId: string) {
  return approvedInDb(useDB(), tankId)
}

/** The time up to which the tank's readings and events are locked, or null when nothing is signed. */
export function lockedUntil(tankId: string): string | null {
  return lockedUntilInDb(useDB(), tankId)
}

/**
 * Throws 409 when an entry lies inside the signed-off record of the tank: taken at or
 * before the decision, or held in the decision's snapshot whatever its date. Call it with
 * the entry's stored time and id before an edit or delete, and with the new time when an
 * edit or a new entry would move into that period.
 */
export function assertEntryUnlocked(tankId: string, entryTime: string | Date, entryId?: string): void {
  const refusal = entryLockRefusal(useDB(), tankId, entryTime, entryId)
  if (refusal) throw createError({ statusCode: 409, statusMessage: refusal.message, message: refusal.message, data: { lockedUntil: refusal.lockedUntil } })
}

/** Throws 409 when the stage was finished in the current sign-off's record: it changes only after reopening. */
export function assertStageUnsigned(tankId: string, stageKey: string): void {
  const message = stageLockRefusal(useDB(), tankId, stageKey)
  if (message) throw createError({ statusCode: 409, statusMessage: message, message })
}
