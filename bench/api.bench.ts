/**
 * API throughput under autocannon against the built server on loopback: each Tidewright
 * route beside a floor route (server/api/bench/, enabled only by NUXT_BENCH_ROUTES=1)
 * that runs the same better-sqlite3 query with no session, validation or shaping. The
 * ratio route/floor is what the framework, auth, validation and domain code cost on
 * this machine. Aim: at least half the floor's throughput.
 */
import autocannon from 'autocannon'
import Database from 'better-sqlite3'
import { signInCookie, type BenchServer, type Row } from './support'

// BENCH_API_CONNECTIONS=1,16 and BENCH_API_CASES=POST (words of the case names) narrow a run to the rows being worked on.
const CONNECTIONS = (process.env.BENCH_API_CONNECTIONS ?? '1,16,64').split(',').map(Number)
const CASE_WORDS = (process.env.BENCH_API_CASES ?? '').split(',').filter(word => word !== '')

interface Case {
  name: string
  route: { method: 'GET' | 'POST', path: string, body?: () => string }
  floor: { method: 'GET' | 'POST', path: string, body?: () => string }
  /** The aim printed beside the ratio at a number of connections, where it is not half the floor. */
  aim?: (connections: number) => string
  /** Called before each run of the route: puts back what the case's earlier runs changed. */
  reset?: () => void
}

/**
 * Removes the tests saved on `tankId` since `since` (entry time): the year's tests were entered
 * at their own times, so what goes is exactly what the bench saved. Deleted rows move the tank's
 * data revision, so the server reads its history again, as after any delete.
 */
function removeTestsSavedSince(dbPath: string, tankId: string, since: string): number {
  const db = new Database(dbPath)
  try {
    db.pragma('busy_timeout = 5000')
    return db.prepare('delete from readings where tank_id = ? and created_at >= ?').run(tankId, since).changes
  }
  finally {
    db.close()
  }
}

interface Measured { rps: number, p50: number, p99: number, non2xx: number, errors: number, timeouts: number }

/** `body`, when given, is called for every request: each write its own body. */
function run(url: string, method: 'GET' | 'POST', connections: number, seconds: number, headers: Record<string, string>, body?: () => string): Promise<Measured> {
  return new Promise((resolve, reject) => {
    const requests = body ? [{ setupRequest: (request: Record<string, unknown>) => ({ ...request, body: body() }) }] : undefined
    autocannon({ url, method, connections, duration: seconds, headers, pipelining: 1, requests }, (error, result) => {
      if (error) return reject(error)
      resolve({ rps: result.requests.average, p50: result.latency.p50, p99: result.latency.p99, non2xx: result.non2xx, errors: result.errors - result.timeouts, timeouts: result.timeouts })
    })
  })
}

async function check(url: string, method: string, headers: Record<string, string>, body?: string): Promise<void> {
  const response = await fetch(url, { method, headers, body })
  if (response.status >= 300) throw new Error(`${method} ${url} answered ${response.status} before the benchmark: ${await response.text()}`)
}

export async function runApiBench(bench: BenchServer, seconds: number): Promise<Row[]> {
  const { baseURL } = bench.server
  const { demo } = bench.fixtures
  const cookie = await signInCookie(baseURL, 'client@tidewright.test')
  const lounge = demo.tanks.lounge
  // The floor's inserts go to another tank: thousands of them on the measured tank would
  // lengthen the history the real route then re-evaluates, and measure that instead.
  // Each write 40 minutes before the last (36 a day beside the year's two), so no day passes
  // TESTS_PER_TANK_PER_DAY and every write is a 201.
  let written = 0
  const readingBody = () => JSON.stringify({
    takenAt: new Date(Date.now() - 3_600_000 - written++ * 2_400_000).toISOString(), ammonia: 0.1, nitrite: 0.2, nitrate: 5,
    basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, pH: 8.1, temperature: 25.5, temperatureUnit: 'C', salinity: 34.8, salinityMode: 'practical',
  })
  // Each connection count saves into the year of history the case names: a run at 450 saves a
  // second leaves thousands more, and past LONG_HISTORY_TESTS (5,000) the next run would measure
  // the pool's path for a long history instead (the bulk case measures saves on one).
  const saveCaseStart = new Date().toISOString()
  const backToTheYear = () => {
    removeTestsSavedSince(bench.dbPath, lounge, saveCaseStart)
    written = 0
  }
  const floorReadingBody = () => JSON.stringify({ takenAt: new Date(Date.now() - 3_600_000).toISOString(), ammoniaN: 0.1, nitriteN: 0.2, nitrateN: 5, pH: 8.1, temperatureC: 25.5, salinity: 34.8 })
  const cases: Case[] = [
    { name: 'GET /api/tanks', route: { method: 'GET', path: '/api/tanks' }, floor: { method: 'GET', path: `/api/bench/tanks?org=${demo.organisationId}` } },
    { name: 'GET /api/tanks/:id', route: { method: 'GET', path: `/api/tanks/${lounge}` }, floor: { method: 'GET', path: `/api/bench/tanks/${lounge}` } },
    { name: 'GET /api/tanks/:id/readings (year of data)', route: { method: 'GET', path: `/api/tanks/${lounge}/readings` }, floor: { method: 'GET', path: `/api/bench/tanks/${lounge}/readings` } },
    { name: 'GET /api/tanks/:id/verdict', route: { method: 'GET', path: `/api/tanks/${lounge}/verdict` }, floor: { method: 'GET', path: `/api/bench/tanks/${lounge}/verdict` } },
    // Writes last: they grow the tank's history for everything after them.
    // A save evaluates the tank's year of history with the engine, which a bare insert does not:
    // its aim is its own (issue 18, item 3), a quarter of the floor at 1 connection and p99 under 100 ms at 16.
    { name: 'POST /api/tanks/:id/readings', route: { method: 'POST', path: `/api/tanks/${lounge}/readings`, body: readingBody }, floor: { method: 'POST', path: `/api/bench/tanks/${demo.tanks.lobby}/readings`, body: floorReadingBody }, aim: n => (n === 1 ? '>= 0.25' : n === 16 ? 'p99 < 100 ms' : ''), reset: backToTheYear },
  ]
  const rows: Row[] = []
  for (const c of cases.filter(c => CASE_WORDS.length === 0 || CASE_WORDS.some(word => c.name.includes(word)))) {
    const headers = { cookie, 'content-type': 'application/json' }
    await check(baseURL + c.route.path, c.route.method, headers, c.route.body?.())
    await check(baseURL + c.floor.path, c.floor.method, { 'content-type': 'application/json' }, c.floor.body?.())
    for (const connections of CONNECTIONS) {
      const floor = await run(baseURL + c.floor.path, c.floor.method, connections, seconds, { 'content-type': 'application/json' }, c.floor.body)
      c.reset?.()
      const route = await run(baseURL + c.route.path, c.route.method, connections, seconds, headers, c.route.body)
      if (route.non2xx || route.errors || floor.non2xx || floor.errors) {
        throw new Error(`${c.name} at ${connections}: ${route.non2xx} non-2xx, ${route.errors} errors (floor ${floor.non2xx}, ${floor.errors})`)
      }
      rows.push({
        area: 'API', name: `${c.name} @${connections}`, value: route.rps, unit: 'req/s',
        reference: { name: `floor ${floor.rps.toFixed(0)} req/s; p50/p99 ${route.p50}/${route.p99} ms (floor ${floor.p50}/${floor.p99})${route.rps === 0 ? `; no request finished within ${seconds} s` : ''}`, value: floor.rps },
        ratio: route.rps / floor.rps, aim: c.aim?.(connections) ?? '>= 0.50',
      })
    }
  }
  return rows
}
