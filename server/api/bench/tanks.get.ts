/**
 * GET /api/bench/tanks?org=<id> — benchmark floor for GET /api/tanks: the same joined
 * query on the raw better-sqlite3 connection, with no session, no validation and no
 * shaping. 404 unless NUXT_BENCH_ROUTES=1. Returns { items, total }.
 */
const LIST_SQL = `select t.*, c.name as client_name, s.label as site_label, a.name as aquarist_name, v.phase
  from tanks t join clients c on c.id = t.client_id left join sites s on s.id = t.site_id
  left join users a on a.id = t.aquarist_id left join users sv on sv.id = t.supervisor_id
  left join tank_verdicts v on v.tank_id = t.id
  where t.organisation_id = ? and t.archived_at is null order by t.updated_at desc, t.id asc limit 25 offset 0`
const COUNT_SQL = `select count(*) as n from tanks t join clients c on c.id = t.client_id where t.organisation_id = ? and t.archived_at is null`

export default defineEventHandler((event) => {
  requireBenchRoutes()
  const org = String(getQuery(event).org ?? '')
  const sqlite = useDB().$client
  return { items: sqlite.prepare(LIST_SQL).all(org), total: (sqlite.prepare(COUNT_SQL).get(org) as { n: number }).n }
})
