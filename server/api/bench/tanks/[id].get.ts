/**
 * GET /api/bench/tanks/:id — benchmark floor for GET /api/tanks/:id: the same joined
 * query on the raw connection, no session or validation. 404 unless NUXT_BENCH_ROUTES=1.
 * Returns the raw row.
 */
const ONE_SQL = `select t.*, c.name as client_name, s.label as site_label, a.name as aquarist_name, sv.name as supervisor_name, v.phase
  from tanks t join clients c on c.id = t.client_id left join sites s on s.id = t.site_id
  left join users a on a.id = t.aquarist_id left join users sv on sv.id = t.supervisor_id
  left join tank_verdicts v on v.tank_id = t.id where t.id = ? and t.archived_at is null`

export default defineEventHandler((event) => {
  requireBenchRoutes()
  return useDB().$client.prepare(ONE_SQL).get(getRouterParam(event, 'id')) ?? null
})
