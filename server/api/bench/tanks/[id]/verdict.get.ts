/**
 * GET /api/bench/tanks/:id/verdict — benchmark floor for GET /api/tanks/:id/verdict: the
 * stored verdict row and the readings its findings cite, on the raw connection, no
 * session or validation. 404 unless NUXT_BENCH_ROUTES=1. Returns { verdict, readings }.
 */
export default defineEventHandler((event) => {
  requireBenchRoutes()
  const sqlite = useDB().$client
  const row = sqlite.prepare('select * from tank_verdicts where tank_id = ?').get(getRouterParam(event, 'id')) as { verdict: string } | undefined
  if (!row) return null
  const verdict = JSON.parse(row.verdict) as { findings: { readingIds: string[] }[] }
  const ids = [...new Set(verdict.findings.flatMap(f => f.readingIds))].slice(0, 500)
  const cited = ids.length
    ? sqlite.prepare(`select id, taken_at, ammonia_n, nitrite_n, nitrate_n from readings where id in (${ids.map(() => '?').join(',')})`).all(...ids)
    : []
  return { verdict, readings: cited }
})
