import type { PlanTemplateStage } from '../../shared/plan/default-template'
import type { ChecklistItem, planStages } from './schema'

/** The rows that give a tank its own copy of a plan template, in order. */
export function planStageRows(tankId: string, template: readonly PlanTemplateStage[]): (typeof planStages.$inferInsert)[] {
  return template.map((stage, index) => ({
    tankId,
    position: index + 1,
    key: stage.key,
    title: stage.title,
    checklist: stage.checklist.map((label, i): ChecklistItem => ({ id: `${stage.key}-${i + 1}`, label, done: false })),
  }))
}
