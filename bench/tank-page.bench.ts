/**
 * Tank page benchmark: a tank with a year of twice-daily readings, served by the built
 * server on a temporary database. Measures server time of the routes the tank page
 * reads, the chart payload size, and a 100,000-row CSV import's time (its ratio to a raw
 * insert loop is bulk.bench.ts's, the one floor for imports). Prints values and ratios
 * measured in this one run.
 *
 *   npx tsx bench/tank-page.bench.ts
 */
import { execSync } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'
import { pathToFileURL } from 'node:url'
import { eq } from 'drizzle-orm'
import { buildIsStale } from '../scripts/build-state.mjs'
import { migrateDatabase, openDatabase } from '../server/db/connection'
import { events, readings } from '../server/db/schema'
import { computeAndStoreVerdict } from '../server/db/verdicts'
import { seedFixtures } from '../tests/support/fixtures'
import { startServer } from '../tests/support/server'

export interface BenchResult { name: string, value: number, unit: string }

const DAY = 86_400_000
const IMPORT_ROWS = 100_000

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.floor(sorted.length / 2)] ?? Number.NaN
}

/** A year of twice-daily tests: a fishless cycle over the first five weeks, then a settled tank. */
function yearOfReadings(tankId: string, userId: string, now: number) {
  const rows: (typeof readings.$inferInsert)[] = []
  for (let i = 0; i < 730; i++) {
    const t = now - (730 - i) * DAY / 2
    const day = i / 2
    const ammoniaN = day < 7 ? 1.6 : Math.max(0, 1.6 * (1 - (day - 7) / 7))
    const nitriteN = day > 5 && day < 30 ? Math.max(0, 1.4 * (1 - Math.abs(day - 15) / 12)) : 0
    rows.push({
      tankId, enteredBy: userId, takenAt: new Date(t).toISOString(),
      ammoniaN, nitriteN, nitrateN: Math.min(8, Math.max(0, (day - 9) * 0.35)),
      pH: 8.1 + (i % 5) * 0.02, temperatureC: 25 + (i % 7) * 0.1, salinity: 34.8 + (i % 3) * 0.1,
      entered: {},
    })
  }
  return rows
}

async function timed(url: string, cookie: string, runs: number): Promise<{ ms: number, bytes: number, body: string }> {
  const times: number[] = []
  let body = ''
  for (let i = 0; i < runs; i++) {
    const start = performance.now()
    const response = await fetch(url, { headers: { cookie } })
    body = await response.text()
    times.push(performance.now() - start)
    if (!response.ok) throw new Error(`${url}: ${response.status} ${body.slice(0, 200)}`)
  }
  return { ms: median(times), bytes: Buffer.byteLength(body), body }
}

// 40 minutes apart (36 a day): room under TESTS_PER_TANK_PER_DAY beside the tank's own tests.
function importCsv(rows: number, now: number): string {
  const lines = ['taken_at,ammonia_mg_l_n,nitrite_mg_l_n,nitrate_mg_l_n,ph,temperature_c,salinity_practical,notes']
  for (let i = 0; i < rows; i++) {
    lines.push(`${new Date(now - (rows - i) * 2_400_000).toISOString()},${(i % 9) / 10},${(i % 7) / 10},${i % 30},8.${i % 4},25.${i % 9},35.${i % 3},bench ${i}`)
  }
  return `${lines.join('\n')}\n`
}

/** Runs the benchmark; returns the measured values (and prints them). */
export async function runTankPageBench(): Promise<BenchResult[]> {
  if (buildIsStale()) execSync('npx nuxt build', { stdio: 'inherit' })
  const dir = mkdtempSync(join(tmpdir(), 'tidewright-bench-'))
  const dbPath = join(dir, 'bench.sqlite')
  const db = openDatabase(dbPath)
  migrateDatabase(db)
  const fixtures = await seedFixtures(db)
  const now = Date.now()
  const tankId = fixtures.demo.tanks.lounge
  db.delete(readings).where(eq(readings.tankId, tankId)).run()
  db.delete(events).where(eq(events.tankId, tankId)).run()
  db.insert(readings).values(yearOfReadings(tankId, fixtures.demo.users.client, now)).run()
  db.insert(events).values([
    { tankId, at: new Date(now - 365 * DAY).toISOString(), kind: 'ammonia-dose', amount: 1.6, enteredBy: fixtures.demo.users.aquarist },
    { tankId, at: new Date(now - 330 * DAY).toISOString(), kind: 'ammonia-dose', amount: 1.6, enteredBy: fixtures.demo.users.aquarist },
    { tankId, at: new Date(now - 300 * DAY).toISOString(), kind: 'livestock-added', amount: 3, group: 'fish', enteredBy: fixtures.demo.users.aquarist },
  ]).run()
  const evalStart = performance.now()
  computeAndStoreVerdict(db, tankId, new Date(now))
  const engineMs = performance.now() - evalStart
  db.$client.close()

  const server = await startServer({ dbPath })
  const results: BenchResult[] = []
  try {
    const login = await fetch(`${server.baseURL}/api/auth/login`, {
      method: 'POST', headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'aquarist@tidewright.test', password: 'tidewright-demo' }),
    })
    if (!login.ok) throw new Error(`sign-in failed: ${login.status}`)
    const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    const base = `${server.baseURL}/api/tanks/${tankId}`
    const runs = 30
    await timed(`${base}/verdict`, cookie, 3) // warm up
    const page = await timed(`${base}/readings?pageSize=25`, cookie, runs)
    const all = await timed(`${base}/readings?pageSize=500`, cookie, runs)
    const verdict = await timed(`${base}/verdict`, cookie, runs)
    const chart = await timed(`${base}/chart`, cookie, runs)
    const tankView = await timed(`${base}`, cookie, runs)

    // One reading written: the handler re-evaluates the whole year with the engine.
    const writes: number[] = []
    for (let i = 0; i < 10; i++) {
      const start = performance.now()
      const response = await fetch(`${base}/readings`, {
        method: 'POST', headers: { 'content-type': 'application/json', cookie },
        body: JSON.stringify({ takenAt: new Date(now - i * 60_000).toISOString(), ammonia: 0, nitrite: 0, nitrate: 10, basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, temperatureUnit: 'C', salinityMode: 'practical' }),
      })
      await response.text()
      writes.push(performance.now() - start)
    }

    // 100,000 rows through the import route (parse, map, validate, hash, one transaction) ...
    const csv = importCsv(IMPORT_ROWS, now)
    const importTank = fixtures.other.tankId
    const otherLogin = await fetch(`${server.baseURL}/api/auth/login`, {
      method: 'POST', headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'aquarist@other-company.test', password: 'tidewright-demo' }),
    })
    const otherCookie = otherLogin.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    const dryStart = performance.now()
    const dry = await fetch(`${server.baseURL}/api/tanks/${importTank}/readings/import`, {
      method: 'POST', headers: { 'content-type': 'application/json', 'cookie': otherCookie },
      body: JSON.stringify({ csv, dryRun: true }),
    })
    await dry.text()
    const dryMs = performance.now() - dryStart
    const importStart = performance.now()
    const imported = await fetch(`${server.baseURL}/api/tanks/${importTank}/readings/import`, {
      method: 'POST', headers: { 'content-type': 'application/json', 'cookie': otherCookie },
      body: JSON.stringify({ csv, dryRun: false }),
    })
    const importBody = await imported.json() as { inserted: number }
    const importMs = performance.now() - importStart
    if (importBody.inserted !== IMPORT_ROWS) throw new Error(`import inserted ${importBody.inserted}`)
    // The verdict refresh over 100,000 readings runs right after the import answers.
    const verdictStart = performance.now()
    await (await fetch(`${server.baseURL}/api/tanks/${importTank}/verdict`, { headers: { cookie: otherCookie } })).text()
    const afterImportVerdictMs = performance.now() - verdictStart

    results.push(
      { name: 'engine: evaluate a year of twice-daily readings (in process)', value: engineMs, unit: 'ms' },
      { name: 'GET /readings (25 per page), median', value: page.ms, unit: 'ms' },
      { name: 'GET /readings (500 per page), median', value: all.ms, unit: 'ms' },
      { name: 'GET /verdict (stored), median', value: verdict.ms, unit: 'ms' },
      { name: 'GET /chart (730 readings), median', value: chart.ms, unit: 'ms' },
      { name: 'GET /tanks/:id, median', value: tankView.ms, unit: 'ms' },
      { name: 'POST /readings incl. verdict refresh, median', value: median(writes), unit: 'ms' },
      { name: 'chart payload', value: chart.bytes, unit: 'bytes' },
      { name: 'chart payload gzip', value: gzipSync(chart.body).byteLength, unit: 'bytes' },
      { name: 'readings list payload (500 rows)', value: all.bytes, unit: 'bytes' },
      { name: 'chart payload per reading', value: chart.bytes / 730, unit: 'bytes' },
      { name: 'ratio: verdict route / tank route', value: verdict.ms / tankView.ms, unit: 'x' },
      { name: 'ratio: chart payload / readings list payload per row', value: (chart.bytes / 730) / (all.bytes / 500), unit: 'x' },
      { name: 'ratio: POST reading (with engine) / GET verdict', value: median(writes) / verdict.ms, unit: 'x' },
      { name: `import ${IMPORT_ROWS} rows via route`, value: importMs, unit: 'ms' },
      { name: `import ${IMPORT_ROWS} rows, dry run (parse, map, validate, hash)`, value: dryMs, unit: 'ms' },
      { name: 'first GET /verdict after the import (waits for the refresh)', value: afterImportVerdictMs, unit: 'ms' },
    )
  }
  finally {
    await server.stop()
    rmSync(dir, { recursive: true, force: true })
  }
  for (const r of results) console.log(`${r.name.padEnd(62)} ${r.value.toFixed(r.unit === 'x' ? 2 : r.unit === 'bytes' ? 0 : 1).padStart(10)} ${r.unit}`)
  return results
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  runTankPageBench().catch((error) => {
    console.error(error)
    process.exit(1)
  })
}
