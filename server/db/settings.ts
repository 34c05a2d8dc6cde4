/**
 * The one way the server reads a company's settings: the stored JSON parsed by the shared
 * settings schema, defaults filled in. Framework-free (takes a database handle) so the
 * worker, the engine runs, the routes and the seed share it.
 */
import { eq } from 'drizzle-orm'
import { parseStoredSettings, type OrganisationSettings } from '../../shared/schemas/settings'
import type { Db } from './connection'
import { organisations } from './schema'

/** The company's settings with defaults; Tidewright's defaults for an organisation that does not exist. */
export function readOrganisationSettings(db: Db, organisationId: string): OrganisationSettings {
  const row = db.select({ settings: organisations.settings }).from(organisations).where(eq(organisations.id, organisationId)).get()
  return parseStoredSettings(row?.settings)
}
