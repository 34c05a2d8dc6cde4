/**
 * GET /api/bench/tanks/:id/readings — benchmark floor for GET /api/tanks/:id/readings:
 * the same page query (newest 25 with the enterer's name) and count on the raw
 * connection, no session, validation or shaping. 404 unless NUXT_BENCH_ROUTES=1. Returns { items, total }.
 */
const PAGE_SQL = `select r.*, u.name as entered_by_name from readings r left join users u on u.id = r.entered_by
  where r.tank_id = ? order by r.taken_at desc, r.id desc limit 25 offset 0`
const COUNT_SQL = 'select count(*) as n from readings where tank_id = ?'

export default defineEventHandler((event) => {
  requireBenchRoutes()
  const id = getRouterParam(event, 'id')
  const sqlite = useDB().$client
  return { items: sqlite.prepare(PAGE_SQL).all(id), total: (sqlite.prepare(COUNT_SQL).get(id) as { n: number }).n }
})
