import { migrateDatabase, openDatabase, type TidewrightDB } from '#server/db/connection'

export * as tables from '#server/db/schema'

let db: TidewrightDB | undefined

/** The process's single database connection, opened on first use from runtimeConfig.dbPath. */
export function useDB(): TidewrightDB {
  if (!db) db = openDatabase(useRuntimeConfig().dbPath)
  return db
}

/** Applies pending migrations; called once by the migrate plugin at start. */
export function migrateDB(): void {
  migrateDatabase(useDB(), useRuntimeConfig().migrationsDir)
}
