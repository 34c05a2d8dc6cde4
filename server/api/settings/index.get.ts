import type { CompanySettingsView } from '#shared/types/settings'
import { readCompanySettings } from '#server/domain/settings/update'

/** GET /api/settings — the company's name and settings with defaults filled in, and the version to send back when saving. Returns CompanySettingsView. */
export default defineEventHandler(async (event): Promise<CompanySettingsView> => {
  const actor = await requireActor(event, ['admin'])
  const view = readCompanySettings(useDB(), actor.organisationId)
  if (!view) throw createError({ statusCode: 404, statusMessage: 'Company not found' })
  return view
})
