import { DEFAULT_DB_PATH } from '../server/db/connection'

/** The database file the scripts act on: NUXT_DB_PATH, as the server reads it. */
export function dbPathFromEnv(): string {
  return process.env.NUXT_DB_PATH || DEFAULT_DB_PATH
}
