/** Brings the database schema up to date before the first request is served. */
export default defineNitroPlugin(() => {
  migrateDB()
})
