/**
 * Changing a build-plan stage, framework-free: checklist ticks and finishing carry who and
 * when, stage data is checked against the stage's own schema, and the commissioning gates
 * (shared/plan/gates.ts) run on the result. A wrong field is a FieldRefused (400 per field).
 */
import { and, eq } from 'drizzle-orm'
import * as v from 'valibot'
import { stageGateIssues } from '#shared/plan/gates'
import { surveyLoad } from '#shared/plan/survey-load'
import { stageDataSchema, type StagePatch } from '#shared/schemas/plan'
import { appliesTo, type TankTrigger } from '#shared/tanks/lifecycle'
import type { StageStatus } from '#shared/vocabulary'
import type { Db } from '#server/db/connection'
import { planStages, type ChecklistItem, type tanks } from '#server/db/schema'
import { FieldRefused, toFieldIssues } from '#server/domain/validation/field-issues'

type TankRow = typeof tanks.$inferSelect
type StageRow = typeof planStages.$inferSelect

/** Whoever changes the stage: ticks and finishing carry their id; a structural check, their name. */
export interface StageEditor { id: string, name: string }

/** The stage row of a tank, or undefined. */
export function findStage(db: Db, tankId: string, stageId: string): StageRow | undefined {
  return db.select().from(planStages).where(and(eq(planStages.id, stageId), eq(planStages.tankId, tankId))).get()
}

/** Checks `data` against the stage's own schema (refused per field) and merges it over what is stored. */
export function mergeStageData(key: string, stored: Record<string, unknown>, incoming: Record<string, unknown>): Record<string, unknown> {
  const result = v.safeParse(stageDataSchema(key), incoming)
  if (!result.success) throw new FieldRefused(toFieldIssues(result.issues).map(i => ({ ...i, field: i.field === '(body)' ? 'data' : `data.${i.field}` })))
  const merged: Record<string, unknown> = { ...stored }
  for (const [name, value] of Object.entries(result.output as Record<string, unknown>)) {
    if (value === null || value === undefined) delete merged[name]
    else merged[name] = value
  }
  return merged
}

/** A survey's structural-check acknowledgement carries who recorded it and when; clearing it clears both. */
function stampStructuralCheck(editor: StageEditor, stored: Record<string, unknown>, data: Record<string, unknown>, now: Date): Record<string, unknown> {
  if (data.structuralCheckDone === stored.structuralCheckDone && data.structuralCheckBy === stored.structuralCheckBy) return data
  const { structuralCheckRecordedBy: _by, structuralCheckRecordedAt: _at, ...rest } = data
  return rest.structuralCheckDone === true ? { ...rest, structuralCheckRecordedBy: editor.name, structuralCheckRecordedAt: now.toISOString() } : rest
}

/** Refuses (per field) a stage change its commissioning gate does not allow: a short leak test, an unacknowledged heavy floor load. */
function enforceGates(db: Db, tank: TankRow, stage: StageRow, data: Record<string, unknown>, closing: boolean, now: Date) {
  const others = db.select({ key: planStages.key, data: planStages.data }).from(planStages).where(eq(planStages.tankId, tank.id)).all()
  const stages = others.map(s => (s.key === stage.key ? { key: s.key, data } : s))
  const issues = stageGateIssues(stage.key, data, closing, { now, surveyLoadRatio: surveyLoad(tank, stages)?.ratioToDesignLiveLoad ?? null })
  if (issues.length) throw new FieldRefused(issues)
}

/** The new row values for a stage change: ticks carry who and when, finishing carries who and when; gates are checked on the result. */
export function applyStagePatch(db: Db, editor: StageEditor, tank: TankRow, stage: StageRow, patch: StagePatch, now: Date) {
  const at = now.toISOString()
  const next: Partial<typeof planStages.$inferInsert> = {}
  if (patch.checklist) {
    const ticks = new Map(patch.checklist.map(i => [i.id, i.done]))
    for (const id of ticks.keys()) {
      if (!stage.checklist.some(item => item.id === id)) throw new FieldRefused([{ field: 'checklist', message: 'That checklist item is not on this stage.' }])
    }
    next.checklist = stage.checklist.map((item): ChecklistItem => {
      const done = ticks.get(item.id)
      if (done === undefined || done === item.done) return item
      return done ? { ...item, done, doneBy: editor.id, doneAt: at } : { ...item, done, doneBy: null, doneAt: null }
    })
  }
  if (patch.notes !== undefined) next.notes = patch.notes?.trim() ? patch.notes : null
  if (patch.data) next.data = stampStructuralCheck(editor, stage.data, mergeStageData(stage.key, stage.data, patch.data), now)
  if (patch.status && patch.status !== stage.status) {
    next.status = patch.status
    if (patch.status === 'done' || patch.status === 'skipped') {
      next.completedBy = editor.id
      next.completedAt = at
    }
    else {
      next.completedBy = null
      next.completedAt = null
    }
    next.skipReason = patch.status === 'skipped' ? patch.skipReason!.trim() : null
  }
  else if (patch.skipReason !== undefined && stage.status === 'skipped') {
    if (!patch.skipReason?.trim()) throw new FieldRefused([{ field: 'skipReason', message: 'Say why the stage is skipped.' }])
    next.skipReason = patch.skipReason.trim()
  }
  if (next.data || next.status) enforceGates(db, tank, stage, next.data ?? stage.data, (next.status ?? stage.status) === 'done', now)
  return next
}

/** What a stage change does to the tank's own status: the first started stage starts the build, a finished fill starts the cycle. */
export function tankTriggerAfterStage(tank: Pick<TankRow, 'status'>, stageKey: string, newStatus: StageStatus | undefined): TankTrigger | null {
  if (!newStatus || newStatus === 'not-started') return null
  const trigger = stageKey === 'water-fill' && newStatus === 'done' ? 'water-filled' : 'stage-started'
  return appliesTo(trigger, tank.status) ? trigger : null
}
