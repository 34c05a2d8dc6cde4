/**
 * The one way the server reads a company's settings: the stored JSON parsed by the shared
 * settings schema, defaults filled in. Framework-free (takes a database handle) so the
 * worker, the engine runs, the routes and the seed share it.
 */
import { eq, sql } from 'drizzle-orm'
import { parseStoredSettings, type OrganisationSettings } from '../../shared/schemas/settings'
import type { Db } from './connection'
import { preparedPerDb } from './prepared'
import { organisations } from './schema'

/** Every verdict refresh (every save) reads them: prepared once. */
const settingsOf = preparedPerDb(db => db.select({ settings: organisations.settings }).from(organisations)
  .where(eq(organisations.id, sql.placeholder('organisationId'))).prepare())

/** The company's settings with defaults; Tidewright's defaults for an organisation that does not exist. */
export function readOrganisationSettings(db: Db, organisationId: string): OrganisationSettings {
  const row = settingsOf(db).get({ organisationId })
  return parseStoredSettings(row?.settings)
}
