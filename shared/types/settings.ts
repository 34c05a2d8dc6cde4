/** API response shapes of the company settings. */
import type { OrganisationSettings } from '../schemas/settings'

/** GET /api/settings: the company's name and settings with defaults filled in, and the version a save must send back. */
export interface CompanySettingsView {
  name: string
  settings: OrganisationSettings
  version: number
}

/**
 * GET /api/settings/reevaluation: how far re-evaluating the company's tanks after the last
 * threshold change has come (`done` of `total`), and how many of the re-evaluated tanks are
 * now in another cycle phase than before the change.
 */
export interface ReevaluationProgress {
  total: number
  done: number
  phaseChanged: number
}

/** PUT /api/settings: the saved settings and, when a threshold changed, the re-evaluation it started (null otherwise). */
export interface CompanySettingsSaved extends CompanySettingsView {
  reevaluation: ReevaluationProgress | null
}
