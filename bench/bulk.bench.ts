/**
 * Bulk import: 100,000 readings through the CSV import route (one request, one
 * transaction, import keys, verdict refreshed once, all counted) against the physical floor — a raw
 * better-sqlite3 insert loop of the same rows in one transaction on a copy of the same
 * database. Aim: within 2x of the floor's rows/s.
 */
import { randomUUID } from 'node:crypto'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { performance } from 'node:perf_hooks'
import Database from 'better-sqlite3'
import { TESTS_PER_TANK_PER_DAY } from '../shared/readings/limits'
import { signInCookie, type BenchServer, type Row } from './support'

export const BULK_ROWS = 100_000

/** Resident and peak resident memory of a process, from /proc (Linux), in MiB. */
function memoryMiB(pid: number): { rss: number, peak: number } {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8')
  const field = (name: string) => Number(new RegExp(`${name}:\\s+(\\d+)`).exec(status)?.[1] ?? Number.NaN) / 1024
  return { rss: field('VmRSS'), peak: field('VmHWM') }
}

/** Spacing of the rows: 30 minutes, the most a day may hold (TESTS_PER_TANK_PER_DAY = 48), so 100,000 rows are 5.7 years. */
const SPACING_MS = 86_400_000 / TESTS_PER_TANK_PER_DAY

/** `count` readings ending an hour ago, as CSV and as values. */
export function bulkCsv(count: number): { csv: string, rows: { at: string, ammonia: number, nitrite: number, nitrate: number, pH: number, temperature: number, salinity: number }[] } {
  // Whole half-hours, so no day holds more than its cap.
  const end = Math.floor((Date.now() - 3_600_000) / SPACING_MS) * SPACING_MS
  const rows = Array.from({ length: count }, (_, i) => ({
    at: new Date(end - (count - i) * SPACING_MS).toISOString(),
    ammonia: Math.round(Math.abs(Math.sin(i / 50)) * 100) / 100,
    nitrite: Math.round(Math.abs(Math.cos(i / 70)) * 100) / 100,
    nitrate: 2 + (i % 40) / 10,
    pH: 8 + (i % 3) / 10,
    temperature: 25 + (i % 5) / 10,
    salinity: 34 + (i % 7) / 10,
  }))
  const csv = ['takenAt,ammonia,nitrite,nitrate,pH,temperature,salinity', ...rows.map(r => `${r.at},${r.ammonia},${r.nitrite},${r.nitrate},${r.pH},${r.temperature},${r.salinity}`)].join('\n')
  return { csv, rows }
}

export async function runBulkBench(bench: BenchServer): Promise<Row[]> {
  const { baseURL } = bench.server
  const cookie = await signInCookie(baseURL, 'aquarist@tidewright.test')
  const { csv, rows } = bulkCsv(BULK_ROWS)
  // A tank of its own, so nothing is deduplicated against earlier rows.
  const created = await fetch(`${baseURL}/api/tanks`, {
    method: 'POST', headers: { cookie, 'content-type': 'application/json' },
    body: JSON.stringify({ name: 'Bulk import reef', clientId: bench.fixtures.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 1200, widthMm: 500, heightMm: 550 } }),
  })
  if (created.status !== 201) throw new Error(`creating the bulk tank: ${created.status} ${await created.text()}`)
  const tankId = (await created.json()).id as string

  // Floor first, on a copy taken before the import (same schema, indexes and rows).
  const copy = join(bench.dir, 'bulk-floor.sqlite')
  const live = new Database(bench.dbPath)
  await live.backup(copy)
  live.close()
  const db = new Database(copy)
  db.pragma('journal_mode = WAL')
  db.pragma('synchronous = NORMAL')
  const insert = db.prepare(`insert into readings (id, tank_id, taken_at, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity, entered, import_key, created_at, updated_at)
    values (?, ?, ?, ?, ?, ?, ?, ?, ?, '{}', ?, ?, ?)`)
  const keys = rows.map((_, i) => `bulk-${i}`)
  const floorStart = performance.now()
  db.transaction(() => {
    const now = new Date().toISOString()
    rows.forEach((r, i) => insert.run(randomUUID(), tankId, r.at, r.ammonia, r.nitrite, r.nitrate, r.pH, r.temperature, r.salinity, keys[i], now, now))
  })()
  const floorSeconds = (performance.now() - floorStart) / 1000
  db.close()

  const pid = bench.server.process.pid!
  const before = memoryMiB(pid)
  const start = performance.now()
  const response = await fetch(`${baseURL}/api/tanks/${tankId}/readings/import`, {
    method: 'POST', headers: { cookie, 'content-type': 'application/json' },
    body: JSON.stringify({ csv, dryRun: false, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical' }),
  })
  const text = await response.text()
  const answeredSeconds = (performance.now() - start) / 1000
  if (response.status !== 200) throw new Error(`import answered ${response.status}: ${text.slice(0, 500)}`)
  // The one verdict refresh runs after the answer, on the request loop: this read is served
  // once it is done, so the time includes it.
  await (await fetch(`${baseURL}/api/tanks/${tankId}/verdict`, { headers: { cookie } })).arrayBuffer()
  const seconds = (performance.now() - start) / 1000
  const after = memoryMiB(pid)
  const stored = new Database(bench.dbPath, { readonly: true })
  const n = stored.prepare('select count(*) from readings where tank_id = ?').pluck().get(tankId) as number
  stored.close()
  if (n !== BULK_ROWS) throw new Error(`import stored ${n} of ${BULK_ROWS} rows: ${text.slice(0, 500)}`)
  const rps = BULK_ROWS / seconds
  const floorRps = BULK_ROWS / floorSeconds
  return [{
    area: 'Bulk', name: `CSV import of ${BULK_ROWS.toLocaleString('en')} readings (${(csv.length / 1e6).toFixed(1)} MB): answered in ${answeredSeconds.toFixed(1)} s, verdict refreshed at ${seconds.toFixed(1)} s; server RSS ${before.rss.toFixed(0)} MiB before, ${after.rss.toFixed(0)} after, peak ${after.peak.toFixed(0)} (${before.peak.toFixed(0)} before)`, value: rps, unit: 'rows/s',
    reference: { name: `raw insert loop, one transaction ${floorRps.toFixed(0)} rows/s`, value: floorRps },
    ratio: floorRps / rps, aim: '<= 2.0 (slowdown)',
  }]
}
