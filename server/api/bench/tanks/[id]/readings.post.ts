/**
 * POST /api/bench/tanks/:id/readings — benchmark floor for POST /api/tanks/:id/readings:
 * one INSERT of the body's canonical values on the raw connection, no session,
 * validation, audit or re-evaluation. 404 unless NUXT_BENCH_ROUTES=1. Returns { id }.
 */
const INSERT_SQL = `insert into readings (id, tank_id, taken_at, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity, entered, created_at, updated_at)
  values (?, ?, ?, ?, ?, ?, ?, ?, ?, '{}', ?, ?)`

export default defineEventHandler(async (event) => {
  requireBenchRoutes()
  const body = await readBody<Record<string, number | string>>(event)
  const id = crypto.randomUUID()
  const now = new Date().toISOString()
  useDB().$client.prepare(INSERT_SQL).run(id, getRouterParam(event, 'id'), body.takenAt, body.ammoniaN, body.nitriteN, body.nitrateN, body.pH, body.temperatureC, body.salinity, now, now)
  setResponseStatus(event, 201)
  return { id }
})
