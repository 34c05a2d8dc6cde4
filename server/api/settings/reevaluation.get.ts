import type { ReevaluationProgress } from '#shared/types/settings'
import { reevaluationProgress } from '#server/domain/settings/reevaluation'

/**
 * GET /api/settings/reevaluation — how far re-evaluating the company's tanks after the last
 * threshold change has come; resumes the batches if they stopped unfinished (a restart).
 * Returns ReevaluationProgress.
 */
export default defineEventHandler(async (event): Promise<ReevaluationProgress> => {
  const actor = await requireActor(event, ['admin'])
  const progress = reevaluationProgress(useDB(), actor.organisationId)
  if (progress.done < progress.total) reevaluateCompanyInBatches(actor.organisationId)
  return progress
})
