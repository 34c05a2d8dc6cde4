import type { PlanTemplateView } from '#shared/types/plan'
import { STAFF_ROLES } from '#shared/vocabulary'

/** GET /api/plan-template — the company's build-plan template (Tidewright's default until the admin edits it). Returns PlanTemplateView. */
export default defineEventHandler(async (event): Promise<PlanTemplateView> => {
  const actor = await requireActor(event, STAFF_ROLES)
  return companyTemplate(actor.organisationId)
})
