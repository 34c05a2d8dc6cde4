import { sql } from 'drizzle-orm'

/** GET /health — liveness for launchers and load balancers: the database answers. Returns { ok: true }. */
export default defineEventHandler(() => {
  useDB().get(sql`select 1`)
  return { ok: true }
})
