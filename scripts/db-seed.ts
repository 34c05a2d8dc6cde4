/** npm run db:seed — migrates, then inserts the demo company if the database has no organisation yet. */
import { migrateDatabase, openDatabase } from '../server/db/connection'
import { organisations } from '../server/db/schema'
import { seedDemo } from '../server/db/seed/demo'
import { dbPathFromEnv } from './db-path'

const path = dbPathFromEnv()
const db = openDatabase(path)
migrateDatabase(db)
if (db.select().from(organisations).limit(1).all().length) {
  console.log(`${path} already has data; the demo was not seeded again.`)
}
else {
  const ids = await seedDemo(db)
  console.log(`Seeded the demo company into ${path} (${Object.keys(ids.tanks).length} tanks).`)
}
db.$client.close()
