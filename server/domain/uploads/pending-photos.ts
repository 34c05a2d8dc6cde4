/**
 * Test photos are uploaded before their reading is saved, so some are never attached (the
 * form was abandoned, or a script uploads without saving). Framework-free: how many wait
 * unattached on a tank, and which have waited too long and go.
 */
import { and, eq, isNull, lt, sql } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { uploads } from '#server/db/schema'
import { recordAudit } from '#server/domain/audit/record'

/** An unattached photo is removed once it is this old. */
export const PENDING_PHOTO_MAX_AGE_MS = 24 * 3_600_000
/** Unattached photos one tank may hold at once; the next upload is refused until some are used or removed. */
export const PENDING_PHOTOS_PER_TANK = 20

/** An upload attached to nothing: no stage and no reading. */
const unattached = and(isNull(uploads.stageId), isNull(uploads.readingId))

/** How many photos wait on this tank without a stage or reading. */
export function pendingPhotoCount(db: Db, tankId: string): number {
  return db.select({ n: sql<number>`count(*)` }).from(uploads).where(and(eq(uploads.tankId, tankId), unattached)).get()?.n ?? 0
}

/** Whether the tank has room for one more unattached photo. Run it in the transaction that inserts the photo, so two uploads at once cannot both take the last place. */
export function hasPendingPhotoRoom(db: Db, tankId: string): boolean {
  return pendingPhotoCount(db, tankId) < PENDING_PHOTOS_PER_TANK
}

export interface RemovedUpload {
  storageKey: string
  thumbnailKey: string | null
}

/**
 * Deletes the rows of unattached uploads older than a day, each with its audit row, in one
 * transaction; returns their storage keys so the caller removes the bytes afterwards (a
 * crash in between leaves unreferenced bytes, never a row without its file).
 */
export function removeExpiredPendingPhotos(db: Db, now: Date): RemovedUpload[] {
  const before = new Date(now.getTime() - PENDING_PHOTO_MAX_AGE_MS).toISOString()
  return db.transaction((tx) => {
    const expired = tx.select().from(uploads).where(and(unattached, lt(uploads.createdAt, before))).all()
    for (const row of expired) {
      tx.delete(uploads).where(eq(uploads.id, row.id)).run()
      recordAudit(tx, { id: null, organisationId: row.organisationId }, {
        action: 'upload.expire', entity: 'upload', entityId: row.id,
        before: { tankId: row.tankId, mimeType: row.mimeType, sizeBytes: row.sizeBytes, createdAt: row.createdAt },
      })
    }
    return expired.map(row => ({ storageKey: row.storageKey, thumbnailKey: row.thumbnailKey }))
  })
}
