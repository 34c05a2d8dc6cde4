/** A tank's build plan shaped for the API: stages in order with checklists, people and uploads. Framework-free. */
import { asc, eq, inArray } from 'drizzle-orm'
import type { PlanView, StageView, UploadView } from '#shared/types/plan'
import type { Role } from '#shared/vocabulary'
import type { Db } from '#server/db/connection'
import { planStages, uploads, users, type tanks } from '#server/db/schema'

function namesOf(db: Db, ids: (string | null | undefined)[]): Map<string, string> {
  const wanted = [...new Set(ids.filter((id): id is string => !!id))]
  if (!wanted.length) return new Map()
  return new Map(db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted)).all().map(u => [u.id, u.name]))
}

/** One upload row shaped for the API (no storage keys leave the server). */
export function toUploadView(row: typeof uploads.$inferSelect, names: Map<string, string>): UploadView {
  return {
    id: row.id,
    mimeType: row.mimeType,
    sizeBytes: row.sizeBytes,
    originalName: row.originalName,
    hasThumbnail: !!row.thumbnailKey,
    uploadedByName: row.uploadedBy ? names.get(row.uploadedBy) ?? null : null,
    uploadedById: row.uploadedBy,
    createdAt: row.createdAt,
  }
}

function toStageView(row: typeof planStages.$inferSelect, files: (typeof uploads.$inferSelect)[], names: Map<string, string>): StageView {
  return {
    id: row.id,
    position: row.position,
    key: row.key,
    title: row.title,
    status: row.status,
    skipReason: row.skipReason,
    checklist: row.checklist.map(item => ({
      id: item.id,
      label: item.label,
      done: item.done,
      doneBy: item.doneBy ?? null,
      doneByName: item.doneBy ? names.get(item.doneBy) ?? null : null,
      doneAt: item.doneAt ?? null,
    })),
    notes: row.notes,
    data: { ...row.data },
    completedBy: row.completedBy,
    completedByName: row.completedBy ? names.get(row.completedBy) ?? null : null,
    completedAt: row.completedAt,
    updatedAt: row.updatedAt,
    uploads: files.map(f => toUploadView(f, names)),
  }
}

/** A tank's stages in order with their checklists, people and uploads, for a viewer of `role`. The tank must already be known visible. */
export function planView(db: Db, role: Role, tank: typeof tanks.$inferSelect): PlanView {
  const stages = db.select().from(planStages).where(eq(planStages.tankId, tank.id)).orderBy(asc(planStages.position)).all()
  const files = db.select().from(uploads).where(eq(uploads.tankId, tank.id)).orderBy(asc(uploads.createdAt), asc(uploads.id)).all()
  const names = namesOf(db, [
    ...stages.map(s => s.completedBy),
    ...stages.flatMap(s => s.checklist.map(i => i.doneBy)),
    ...files.map(f => f.uploadedBy),
  ])
  return {
    tankId: tank.id,
    canEdit: role === 'admin' || role === 'aquarist',
    stages: stages.map(s => toStageView(s, files.filter(f => f.stageId === s.id), names)),
  }
}
