/** API response shapes of the company settings. */
import type { OrganisationSettings } from '../schemas/settings'

/** GET /api/settings: the company's name and settings with defaults filled in, and the version a save must send back. */
export interface CompanySettingsView {
  name: string
  settings: OrganisationSettings
  version: number
}

/** PUT /api/settings: the saved settings and how many tanks the new thresholds re-evaluated. */
export interface CompanySettingsSaved extends CompanySettingsView {
  reevaluated: { tanks: number, phaseChanged: number }
}
