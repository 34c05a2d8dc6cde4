/** The company's build-plan template and the copy a new tank gets of it, framework-free. */
import { asc, eq } from 'drizzle-orm'
import { DEFAULT_PLAN_TEMPLATE, type PlanTemplateStage } from '#shared/plan/default-template'
import type { Db } from '#server/db/connection'
import { planStageRows } from '#server/db/plan-stages'
import { planTemplateStages } from '#server/db/schema'

/** The company's template, or Tidewright's default when it has none of its own. */
export function companyTemplate(db: Db, organisationId: string): { isDefault: boolean, stages: PlanTemplateStage[] } {
  const rows = db.select().from(planTemplateStages)
    .where(eq(planTemplateStages.organisationId, organisationId)).orderBy(asc(planTemplateStages.position)).all()
  if (!rows.length) return { isDefault: true, stages: DEFAULT_PLAN_TEMPLATE.map(s => ({ ...s, checklist: [...s.checklist] })) }
  return { isDefault: false, stages: rows.map(r => ({ key: r.key, title: r.title, checklist: [...r.checklist] })) }
}

/** The rows that give a new tank its own copy of the company's template. */
export function planRowsForNewTank(db: Db, organisationId: string, tankId: string) {
  return planStageRows(tankId, companyTemplate(db, organisationId).stages)
}
