/** The company's plan template and each tank's own copy of it: reading, shaping and changing stages. */
import { and, asc, eq, inArray } from 'drizzle-orm'
import * as v from 'valibot'
import { DEFAULT_PLAN_TEMPLATE, type PlanTemplateStage } from '#shared/plan/default-template'
import { stageGateIssues } from '#shared/plan/gates'
import { surveyLoad } from '#shared/plan/survey-load'
import { stageDataSchema, type StagePatch } from '#shared/schemas/plan'
import type { PlanView, StageView, UploadView } from '#shared/types/plan'
import { appliesTo, type TankTrigger } from '#shared/tanks/lifecycle'
import type { StageStatus } from '#shared/vocabulary'
import type { tanks, ChecklistItem } from '../db/schema'
import { planStages, planTemplateStages, uploads, users } from '../db/schema'
import { planStageRows } from '../db/plan-stages'
import type { Actor } from './access'

/** The company's template, or Tidewright's default when it has none of its own. */
export function companyTemplate(organisationId: string): { isDefault: boolean, stages: PlanTemplateStage[] } {
  const rows = useDB().select().from(planTemplateStages)
    .where(eq(planTemplateStages.organisationId, organisationId)).orderBy(asc(planTemplateStages.position)).all()
  if (!rows.length) return { isDefault: true, stages: DEFAULT_PLAN_TEMPLATE.map(s => ({ ...s, checklist: [...s.checklist] })) }
  return { isDefault: false, stages: rows.map(r => ({ key: r.key, title: r.title, checklist: [...r.checklist] })) }
}

/** The rows that give a new tank its own copy of the company's template. */
export function planRowsForNewTank(organisationId: string, tankId: string) {
  return planStageRows(tankId, companyTemplate(organisationId).stages)
}

function namesOf(ids: (string | null | undefined)[]): Map<string, string> {
  const wanted = [...new Set(ids.filter((id): id is string => !!id))]
  if (!wanted.length) return new Map()
  return new Map(useDB().select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted)).all().map(u => [u.id, u.name]))
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

/** A tank's stages in order with their checklists, people and uploads. The tank must already be known visible. */
export function planView(actor: Actor, tank: typeof tanks.$inferSelect): PlanView {
  const db = useDB()
  const stages = db.select().from(planStages).where(eq(planStages.tankId, tank.id)).orderBy(asc(planStages.position)).all()
  const files = db.select().from(uploads).where(eq(uploads.tankId, tank.id)).orderBy(asc(uploads.createdAt), asc(uploads.id)).all()
  const names = namesOf([
    ...stages.map(s => s.completedBy),
    ...stages.flatMap(s => s.checklist.map(i => i.doneBy)),
    ...files.map(f => f.uploadedBy),
  ])
  return {
    tankId: tank.id,
    canEdit: actor.role === 'admin' || actor.role === 'aquarist',
    stages: stages.map(s => toStageView(s, files.filter(f => f.stageId === s.id), names)),
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

/** The stage row of a tank, or undefined. */
export function findStage(tankId: string, stageId: string) {
  return useDB().select().from(planStages).where(and(eq(planStages.id, stageId), eq(planStages.tankId, tankId))).get()
}

/** Checks `data` against the stage's own schema (400 with field messages) and merges it over what is stored. */
export function mergeStageData(key: string, stored: Record<string, unknown>, incoming: Record<string, unknown>): Record<string, unknown> {
  const result = v.safeParse(stageDataSchema(key), incoming)
  if (!result.success) {
    const issues = toFieldIssues(result.issues).map(i => ({ ...i, field: i.field === '(body)' ? 'data' : `data.${i.field}` }))
    throw createError({ statusCode: 400, statusMessage: 'Validation Error', message: issues.map(i => `${i.field}: ${i.message}`).join('; '), data: { issues } })
  }
  const merged: Record<string, unknown> = { ...stored }
  for (const [name, value] of Object.entries(result.output as Record<string, unknown>)) {
    if (value === null || value === undefined) delete merged[name]
    else merged[name] = value
  }
  return merged
}

/** A survey's structural-check acknowledgement carries who recorded it and when; clearing it clears both. */
function stampStructuralCheck(actor: Actor, stored: Record<string, unknown>, data: Record<string, unknown>, now: Date): Record<string, unknown> {
  if (data.structuralCheckDone === stored.structuralCheckDone && data.structuralCheckBy === stored.structuralCheckBy) return data
  const { structuralCheckRecordedBy: _by, structuralCheckRecordedAt: _at, ...rest } = data
  return rest.structuralCheckDone === true ? { ...rest, structuralCheckRecordedBy: actor.name, structuralCheckRecordedAt: now.toISOString() } : rest
}

/** Refuses (400, per field) a stage change its commissioning gate does not allow: a short leak test, an unacknowledged heavy floor load. */
function enforceGates(tank: typeof tanks.$inferSelect, stage: typeof planStages.$inferSelect, data: Record<string, unknown>, closing: boolean, now: Date) {
  const others = useDB().select({ key: planStages.key, data: planStages.data }).from(planStages).where(eq(planStages.tankId, tank.id)).all()
  const stages = others.map(s => (s.key === stage.key ? { key: s.key, data } : s))
  const issues = stageGateIssues(stage.key, data, closing, { now, surveyLoadRatio: surveyLoad(tank, stages)?.ratioToDesignLiveLoad ?? null })
  if (issues.length) fieldError(issues)
}

/** The new row values for a stage change: ticks carry who and when, finishing carries who and when; gates are checked on the result. */
export function applyStagePatch(actor: Actor, tank: typeof tanks.$inferSelect, stage: typeof planStages.$inferSelect, patch: StagePatch, now: Date) {
  const at = now.toISOString()
  const next: Partial<typeof planStages.$inferInsert> = {}
  if (patch.checklist) {
    const ticks = new Map(patch.checklist.map(i => [i.id, i.done]))
    for (const id of ticks.keys()) {
      if (!stage.checklist.some(item => item.id === id)) {
        throw createError({ statusCode: 400, statusMessage: 'Validation Error', data: { issues: [{ field: 'checklist', message: 'That checklist item is not on this stage.' }] } })
      }
    }
    next.checklist = stage.checklist.map((item): ChecklistItem => {
      const done = ticks.get(item.id)
      if (done === undefined || done === item.done) return item
      return done ? { ...item, done, doneBy: actor.id, doneAt: at } : { ...item, done, doneBy: null, doneAt: null }
    })
  }
  if (patch.notes !== undefined) next.notes = patch.notes?.trim() ? patch.notes : null
  if (patch.data) next.data = stampStructuralCheck(actor, stage.data, mergeStageData(stage.key, stage.data, patch.data), now)
  if (patch.status && patch.status !== stage.status) {
    next.status = patch.status
    if (patch.status === 'done' || patch.status === 'skipped') {
      next.completedBy = actor.id
      next.completedAt = at
    }
    else {
      next.completedBy = null
      next.completedAt = null
    }
    next.skipReason = patch.status === 'skipped' ? patch.skipReason!.trim() : null
  }
  else if (patch.skipReason !== undefined && stage.status === 'skipped') {
    if (!patch.skipReason?.trim()) throw createError({ statusCode: 400, statusMessage: 'Validation Error', data: { issues: [{ field: 'skipReason', message: 'Say why the stage is skipped.' }] } })
    next.skipReason = patch.skipReason.trim()
  }
  if (next.data || next.status) enforceGates(tank, stage, next.data ?? stage.data, (next.status ?? stage.status) === 'done', now)
  return next
}

/** What a stage change does to the tank's own status: the first started stage starts the build, a finished fill starts the cycle. */
export function tankTriggerAfterStage(tank: Pick<typeof tanks.$inferSelect, 'status'>, stageKey: string, newStatus: StageStatus | undefined): TankTrigger | null {
  if (!newStatus || newStatus === 'not-started') return null
  const trigger = stageKey === 'water-fill' && newStatus === 'done' ? 'water-filled' : 'stage-started'
  return appliesTo(trigger, tank.status) ? trigger : null
}
