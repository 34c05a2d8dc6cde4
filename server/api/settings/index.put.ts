import { CompanySettingsUpdateSchema } from '#shared/schemas/settings'
import type { CompanySettingsSaved } from '#shared/types/settings'
import { reevaluationProgress } from '#server/domain/settings/reevaluation'
import { saveCompanySettings } from '#server/domain/settings/update'

/**
 * PUT /api/settings — saves the company's name and settings if the sent version is still
 * current (409 otherwise). Changed thresholds mark every verdict of the company stale in the
 * same transaction and start re-evaluating them in batches (progress at
 * GET /api/settings/reevaluation). Returns CompanySettingsSaved.
 */
export default defineEventHandler(async (event): Promise<CompanySettingsSaved> => {
  const actor = await requireActor(event, ['admin'])
  const input = await readValidatedBody(event, valid(CompanySettingsUpdateSchema))
  const db = useDB()
  const result = await writeTransaction(tx => saveCompanySettings(tx, actor, input, requestNow(event)))
  if (!result.ok) throw createError({ statusCode: result.status, statusMessage: result.message })
  if (!result.thresholdsChanged.length) return { ...result.view, reevaluation: null }
  reevaluateCompanyInBatches(actor.organisationId)
  return { ...result.view, reevaluation: reevaluationProgress(db, actor.organisationId) }
})
