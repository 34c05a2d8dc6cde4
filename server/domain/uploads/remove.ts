import { eq } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { uploads } from '#server/db/schema'
import { recordAudit } from '#server/domain/audit/record'

type UploadRow = typeof uploads.$inferSelect

/** Whether this person may remove the file: only whoever added it. */
export function mayRemoveUpload(row: Pick<UploadRow, 'uploadedBy'>, actorId: string): boolean {
  return row.uploadedBy !== null && row.uploadedBy === actorId
}

/**
 * Deletes an upload's row with its `upload.delete` audit line in one transaction. The caller
 * removes the stored bytes after the commit (a failed commit must leave the file readable).
 */
export function removeUploadRow(db: Db, actor: { id: string, organisationId: string }, row: UploadRow): void {
  db.transaction((tx) => {
    tx.delete(uploads).where(eq(uploads.id, row.id)).run()
    recordAudit(tx, actor, {
      action: 'upload.delete',
      entity: 'upload',
      entityId: row.id,
      before: { tankId: row.tankId, stageId: row.stageId, readingId: row.readingId, mimeType: row.mimeType, sizeBytes: row.sizeBytes, originalName: row.originalName, uploadedBy: row.uploadedBy },
    })
  })
}
