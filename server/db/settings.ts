/**
 * The one way the server reads a company's settings: the stored JSON parsed by the shared
 * settings schema, defaults filled in. Framework-free (takes a database handle) so the
 * worker, the engine runs, the routes and the seed share it.
 */
import { eq, sql } from 'drizzle-orm'
import type { OrganisationSettings } from '../../shared/schemas/settings'
import { settingsFromText } from '../domain/settings/parsed-settings'
import type { Db } from './connection'
import { preparedPerDb } from './prepared'
import { organisations } from './schema'

/**
 * Every verdict refresh (every save) reads them: prepared once. The row is read every time (a
 * change is seen at once); its text as stored, not parsed by the column's JSON mode, so the same
 * text reuses one parse (settingsFromText).
 */
const settingsTextOf = preparedPerDb(db => db.select({ text: sql<string>`${organisations.settings}` }).from(organisations)
  .where(eq(organisations.id, sql.placeholder('organisationId'))).prepare())

/** The company's settings with defaults (frozen: shared by every reader of the same stored text); Tidewright's defaults for an organisation that does not exist. */
export function readOrganisationSettings(db: Db, organisationId: string): OrganisationSettings {
  const row = settingsTextOf(db).get({ organisationId })
  return settingsFromText(row?.text)
}
