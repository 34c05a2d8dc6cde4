import { eq } from 'drizzle-orm'
import { PlanTemplateSchema } from '#shared/schemas/plan'
import type { PlanTemplateView } from '#shared/types/plan'
import { planTemplateStages } from '#server/db/schema'

/** PUT /api/plan-template — replaces the company's template (admin only). Tanks already planned keep their own copy. Returns PlanTemplateView. */
export default defineEventHandler(async (event): Promise<PlanTemplateView> => {
  const actor = await requireActor(event, ['admin'])
  const input = await readValidatedBody(event, valid(PlanTemplateSchema))
  await writeTransaction((tx) => {
    const before = companyTemplate(actor.organisationId)
    tx.delete(planTemplateStages).where(eq(planTemplateStages.organisationId, actor.organisationId)).run()
    tx.insert(planTemplateStages).values(input.stages.map((stage, index) => ({
      organisationId: actor.organisationId, position: index + 1, key: stage.key, title: stage.title, checklist: stage.checklist,
    }))).run()
    writeAudit(actor, { action: 'plan-template.replace', entity: 'plan_template', entityId: actor.organisationId, before, after: companyTemplate(actor.organisationId) })
  })
  return companyTemplate(actor.organisationId)
})
