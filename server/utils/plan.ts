/**
 * Nitro glue for the build plan: the framework-free template, view and stage commands in
 * server/domain/plan/ on the process's database; a refused field becomes the one 400.
 */
import type { StagePatch } from '#shared/schemas/plan'
import type { PlanView } from '#shared/types/plan'
import type { planStages, tanks } from '#server/db/schema'
import { applyStagePatch as applyInDb, findStage as findInDb } from '#server/domain/plan/stage-change'
import { companyTemplate as templateInDb, planRowsForNewTank as rowsInDb } from '#server/domain/plan/template'
import { planView as viewInDb } from '#server/domain/plan/view'
import type { Actor } from './access'

export { tankTriggerAfterStage } from '#server/domain/plan/stage-change'
export { toUploadView } from '#server/domain/plan/view'

/** The company's template, or Tidewright's default when it has none of its own. */
export function companyTemplate(organisationId: string) {
  return templateInDb(useDB(), organisationId)
}

/** The rows that give a new tank its own copy of the company's template. */
export function planRowsForNewTank(organisationId: string, tankId: string) {
  return rowsInDb(useDB(), organisationId, tankId)
}

/** A tank's stages in order with their checklists, people and uploads. The tank must already be known visible. */
export function planView(actor: Actor, tank: typeof tanks.$inferSelect): PlanView {
  return viewInDb(useDB(), actor.role, tank)
}

/** The stage row of a tank, or undefined. */
export function findStage(tankId: string, stageId: string) {
  return findInDb(useDB(), tankId, stageId)
}

/** The new row values for a stage change; 400 per field when the data, a tick or a gate refuses it. */
export function applyStagePatch(actor: Actor, tank: typeof tanks.$inferSelect, stage: typeof planStages.$inferSelect, patch: StagePatch, now: Date) {
  return fieldAnswer(() => applyInDb(useDB(), actor, tank, stage, patch, now))
}
