/** npm run db:migrate — applies drizzle/ migrations to NUXT_DB_PATH. */
import { migrateDatabase, openDatabase } from '../server/db/connection'
import { dbPathFromEnv } from './db-path'

const path = dbPathFromEnv()
const db = openDatabase(path)
migrateDatabase(db)
db.$client.close()
console.log(`Migrated ${path}`)
