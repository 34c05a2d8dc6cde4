/**
 * Bulk import: 100,000 readings through the CSV import route, the file sent as the request's
 * body as the form sends it (one request, one
 * transaction, import keys, verdict refreshed once, all counted) against the physical floor — a raw
 * better-sqlite3 insert loop of the same rows in one transaction on a copy of the same
 * database. Aim: within 2x of the floor's rows/s. Also the server's memory while importing a
 * tenth of the file and the whole file: flat means the same growth for both.
 */
import { randomUUID } from 'node:crypto'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { performance } from 'node:perf_hooks'
import Database from 'better-sqlite3'
import { TESTS_PER_TANK_PER_DAY } from '../shared/readings/limits'
import { importOptionsQuery } from '../shared/schemas/reading'
import { OTHER_AQUARIST_EMAIL } from '../tests/support/fixtures'
import { signInCookie, type BenchServer, type Row } from './support'

export const BULK_ROWS = 100_000
/** The smaller file whose memory the full one is compared with. */
const SMALL_ROWS = 10_000

/** Resident and peak resident memory of a process, from /proc (Linux), in MiB. */
function memoryMiB(pid: number): { rss: number, peak: number } {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8')
  const field = (name: string) => Number(new RegExp(`${name}:\\s+(\\d+)`).exec(status)?.[1] ?? Number.NaN) / 1024
  return { rss: field('VmRSS'), peak: field('VmHWM') }
}

/** CPU seconds (user + system, all threads) a process has used, from /proc (Linux). */
function cpuSeconds(pid: number): number {
  // Fields after the command's closing parenthesis: utime and stime are the 12th and 13th.
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')
  return (Number(fields[11]) + Number(fields[12])) / 100
}

/** Spacing of the rows: 30 minutes, the most a day may hold (TESTS_PER_TANK_PER_DAY = 48), so 100,000 rows are 5.7 years. */
const SPACING_MS = 86_400_000 / TESTS_PER_TANK_PER_DAY

/** `count` readings ending an hour ago, as CSV and as values. */
/** One row of the bench's file, as the raw loop writes it. */
export interface BulkRow { at: string, ammonia: number, nitrite: number, nitrate: number, pH: number, temperature: number, salinity: number }

export function bulkCsv(count: number): { csv: string, rows: BulkRow[] } {
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

/** A tank of its own, so nothing is deduplicated against earlier rows. */
/**
 * The import's floor: the same rows written by a raw better-sqlite3 insert loop in one
 * transaction, on a copy of `dbPath` taken now (same schema, indexes and triggers), into
 * `tankId`. Wall and CPU seconds of the loop alone; the copy is left at `copyPath`.
 */
export async function rawInsertFloor(dbPath: string, copyPath: string, tankId: string, rows: BulkRow[]): Promise<{ seconds: number, cpuSeconds: number }> {
  const live = new Database(dbPath)
  await live.backup(copyPath)
  live.close()
  const db = new Database(copyPath)
  db.pragma('journal_mode = WAL')
  db.pragma('synchronous = NORMAL')
  const insert = db.prepare(`insert into readings (id, tank_id, taken_at, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity, entered, import_key, created_at, updated_at)
    values (?, ?, ?, ?, ?, ?, ?, ?, ?, '{}', ?, ?, ?)`)
  const keys = rows.map((_, i) => `bulk-${i}`)
  const start = performance.now()
  const cpu = process.cpuUsage()
  db.transaction(() => {
    const now = new Date().toISOString()
    rows.forEach((r, i) => insert.run(randomUUID(), tankId, r.at, r.ammonia, r.nitrite, r.nitrate, r.pH, r.temperature, r.salinity, keys[i], now, now))
  })()
  const seconds = (performance.now() - start) / 1000
  const used = process.cpuUsage(cpu)
  db.close()
  return { seconds, cpuSeconds: (used.user + used.system) / 1e6 }
}

async function bulkTank(bench: BenchServer, cookie: string, name: string): Promise<string> {
  const created = await fetch(`${bench.server.baseURL}/api/tanks`, {
    method: 'POST', headers: { cookie, 'content-type': 'application/json' },
    body: JSON.stringify({ name, clientId: bench.fixtures.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 1200, widthMm: 500, heightMm: 550 } }),
  })
  if (created.status !== 201) throw new Error(`creating the bulk tank: ${created.status} ${await created.text()}`)
  return (await created.json()).id as string
}

interface ImportRun {
  answeredSeconds: number
  /** Until the verdict read after it was served. */
  seconds: number
  /** The server's resident memory before, and the most seen while the import ran (sampled every 50 ms), in MiB. */
  rssBefore: number
  rssMost: number
  /** CPU seconds the server used from the request to the verdict read (all its threads). */
  cpu: number
  /** How long the import held the database's write lock, from the answer's Server-Timing header, in ms. */
  lockHeldMs: number
}

/** The bench's options, in the query string a file sent as the body comes with. */
const IMPORT_OPTIONS = { dryRun: false, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical', mapping: {} } as const
const IMPORT_QUERY = new URLSearchParams(importOptionsQuery(IMPORT_OPTIONS))
/** BULK_IMPORT_AS=json sends the file as JSON text instead, to compare the two ways on the same machine. */
const AS_JSON = process.env.BULK_IMPORT_AS === 'json'

/**
 * Imports `csv` into the tank through the route, sampling the server's memory meanwhile. The
 * file is sent as the request's body (text/csv), as the form sends it (BULK_IMPORT_AS=json:
 * as JSON text, for a comparison); the JSON way is covered by the API tests.
 */
async function timedImport(bench: BenchServer, cookie: string, tankId: string, csv: string, rows: number): Promise<ImportRun> {
  const { baseURL } = bench.server
  const pid = bench.server.process.pid!
  const rssBefore = memoryMiB(pid).rss
  let rssMost = rssBefore
  const cpuBefore = cpuSeconds(pid)
  const sampler = setInterval(() => {
    rssMost = Math.max(rssMost, memoryMiB(pid).rss)
  }, 50)
  const start = performance.now()
  try {
    const response = AS_JSON
      ? await fetch(`${baseURL}/api/tanks/${tankId}/readings/import`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify({ csv, ...IMPORT_OPTIONS }) })
      : await fetch(`${baseURL}/api/tanks/${tankId}/readings/import?${IMPORT_QUERY}`, { method: 'POST', headers: { cookie, 'content-type': 'text/csv' }, body: csv })
    const text = await response.text()
    const lockHeldMs = Number(/import-write-lock;dur=([\d.]+)/.exec(response.headers.get('server-timing') ?? '')?.[1] ?? Number.NaN)
    const answeredSeconds = (performance.now() - start) / 1000
    if (response.status !== 200) throw new Error(`import answered ${response.status}: ${text.slice(0, 500)}`)
    // The route answers once the verdict is refreshed; this read shows it is served.
    await (await fetch(`${baseURL}/api/tanks/${tankId}/verdict`, { headers: { cookie } })).arrayBuffer()
    const seconds = (performance.now() - start) / 1000
    const cpu = cpuSeconds(pid) - cpuBefore
    const stored = new Database(bench.dbPath, { readonly: true })
    const n = stored.prepare('select count(*) from readings where tank_id = ?').pluck().get(tankId) as number
    stored.close()
    if (n !== rows) throw new Error(`import stored ${n} of ${rows} rows: ${text.slice(0, 500)}`)
    return { answeredSeconds, seconds, rssBefore, rssMost: Math.max(rssMost, memoryMiB(pid).rss), cpu, lockHeldMs }
  }
  finally {
    clearInterval(sampler)
  }
}

/** Reads the server's health once more if the first read finds its pooled connection closed. */
async function afterIdle(baseURL: string): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      await (await fetch(`${baseURL}/health`)).arrayBuffer()
      return
    }
    catch (error) {
      if (attempt >= 2) throw error
    }
  }
}

/** Saves made so far by savesMeanwhile: each goes 31 minutes further back. */
let savesSoFar = 0

/** Milliseconds at a quantile of sorted values. */
const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] ?? Number.NaN

/**
 * Another company's aquarist saving one test after another on their own tank (each answer
 * awaited), until `stop` says so: how long each save took, in ms. A save waits whenever the
 * import holds the database's write lock.
 */
async function savesMeanwhile(bench: BenchServer, cookie: string, stop: () => boolean, atMost = Number.POSITIVE_INFINITY): Promise<number[]> {
  const times: number[] = []
  for (let i = 0; !stop() && i < atMost; i++) {
    // 31 minutes apart, going back from an hour ago: never the 48th test of a day.
    const takenAt = new Date(Date.now() - 3_600_000 - (savesSoFar++) * 31 * 60_000).toISOString()
    const start = performance.now()
    const response = await fetch(`${bench.server.baseURL}/api/tanks/${bench.fixtures.other.tankId}/readings`, {
      method: 'POST', headers: { cookie, 'content-type': 'application/json' },
      body: JSON.stringify({ takenAt, ammonia: 0.1, nitrite: 0, nitrate: 5, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical' }),
    })
    await response.arrayBuffer()
    if (response.status !== 201) throw new Error(`the other company's save answered ${response.status}`)
    times.push(performance.now() - start)
  }
  return times.sort((a, b) => a - b)
}

/**
 * Another company's reads of its own tank, one after another (each answer awaited), until `stop`
 * says so, in ms each: while its saves wait for the import's write lock, a read waits only if the
 * request loop itself is held (a save waiting on the loop's connection holds every company).
 */
async function readsMeanwhile(bench: BenchServer, cookie: string, stop: () => boolean, atMost = Number.POSITIVE_INFINITY): Promise<number[]> {
  const times: number[] = []
  for (let i = 0; !stop() && i < atMost; i++) {
    const start = performance.now()
    const response = await fetch(`${bench.server.baseURL}/api/tanks/${bench.fixtures.other.tankId}`, { headers: { cookie } })
    await response.arrayBuffer()
    if (response.status !== 200) throw new Error(`the other company's read answered ${response.status}`)
    times.push(performance.now() - start)
  }
  return times.sort((a, b) => a - b)
}

/**
 * Tests saved one after another on the tank the import filled (100,000 tests), as a client goes
 * on testing after the history is in, in ms each: the first save after the import finds no kept
 * copy of the history on the request loop's connection. Taken a minute apart just before now
 * (the file ends an hour ago on whole half-hours, so today holds at most 45 of its tests: room for 3).
 */
async function savesOnImportedTank(bench: BenchServer, cookie: string, tankId: string, count = 3): Promise<number[]> {
  const times: number[] = []
  for (let i = 0; i < count; i++) {
    const takenAt = new Date(Date.now() - (count - i) * 60_000).toISOString()
    const start = performance.now()
    const response = await fetch(`${bench.server.baseURL}/api/tanks/${tankId}/readings`, {
      method: 'POST', headers: { cookie, 'content-type': 'application/json' },
      body: JSON.stringify({ takenAt, ammoniaN: 0.1, nitriteN: 0, nitrateN: 5, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical' }),
    })
    const text = await response.text()
    if (response.status !== 201) throw new Error(`a save on the imported tank answered ${response.status}: ${text.slice(0, 300)}`)
    times.push(performance.now() - start)
  }
  return times
}

export async function runBulkBench(bench: BenchServer): Promise<Row[]> {
  const cookie = await signInCookie(bench.server.baseURL, 'aquarist@tidewright.test')
  const { csv, rows } = bulkCsv(BULK_ROWS)
  const tankId = await bulkTank(bench, cookie, 'Bulk import reef')
  const smallTankId = await bulkTank(bench, cookie, 'Small import reef')

  // Floor first, on a copy taken before the import (same schema, indexes and rows).
  const { seconds: floorSeconds, cpuSeconds: floorCpuSeconds } = await rawInsertFloor(bench.dbPath, join(bench.dir, 'bulk-floor.sqlite'), tankId, rows)

  // The loop holds this process for seconds, past the server's keep-alive: the pooled connection
  // it closed meanwhile is found by a read, which may be tried again, not by the import.
  await afterIdle(bench.server.baseURL)
  // A tenth of the file first (the peak is a high-water mark): whether memory grows with the file.
  const small = await timedImport(bench, cookie, smallTankId, bulkCsv(SMALL_ROWS).csv, SMALL_ROWS)
  const run = await timedImport(bench, cookie, tankId, csv, BULK_ROWS)
  const longTankSaves = await savesOnImportedTank(bench, cookie, tankId)
  // The same file again into a third tank while another company saves: its own run, so the
  // saves' load does not weigh on the timings above.
  const otherCookie = await signInCookie(bench.server.baseURL, OTHER_AQUARIST_EMAIL)
  const idleSaves = await savesMeanwhile(bench, otherCookie, () => false, 50)
  // Reads beside saves, idle: the same pair as during the import below.
  let idleSaving = true
  const savesBesideIdleReads = savesMeanwhile(bench, otherCookie, () => !idleSaving)
  const idleReads = await readsMeanwhile(bench, otherCookie, () => false, 100).finally(() => {
    idleSaving = false
  })
  await savesBesideIdleReads
  const probedTankId = await bulkTank(bench, cookie, 'Probed import reef')
  let importing = true
  const loadedSaves = savesMeanwhile(bench, otherCookie, () => !importing)
  const loadedReads = readsMeanwhile(bench, otherCookie, () => !importing)
  // Also a second import of the whole file beside the first: once the import's memory has grown to
  // its bounds (page caches, V8's young generation), another file of the same length adds nothing.
  const again = await timedImport(bench, cookie, probedTankId, csv, BULK_ROWS).finally(() => {
    importing = false
  })
  const saves = await loadedSaves
  const reads = await loadedReads
  const rps = BULK_ROWS / run.seconds
  const floorRps = BULK_ROWS / floorSeconds
  const grew = (r: ImportRun) => `${(r.rssMost - r.rssBefore).toFixed(0)} MiB (${r.rssBefore.toFixed(0)} -> ${r.rssMost.toFixed(0)})`
  return [{
    area: 'Bulk', name: `CSV import of ${BULK_ROWS.toLocaleString('en')} readings (${(csv.length / 1e6).toFixed(1)} MB): answered (verdict refreshed) in ${run.answeredSeconds.toFixed(1)} s`, value: rps, unit: 'rows/s',
    reference: { name: `raw insert loop, one transaction ${floorRps.toFixed(0)} rows/s`, value: floorRps },
    ratio: floorRps / rps, aim: '<= 2.0 (slowdown)',
  }, {
    // CPU time moves less than wall time when other work shares the machine.
    area: 'Bulk', name: 'the same import in CPU seconds (server, all threads, until the verdict read)', value: run.cpu, unit: 's CPU',
    reference: { name: `raw insert loop ${floorCpuSeconds.toFixed(2)} s CPU`, value: floorCpuSeconds },
    ratio: run.cpu / floorCpuSeconds, aim: '<= 2.0',
  }, {
    // Every other write (any company's save) waits while the import holds the lock.
    area: 'Bulk', name: `write lock held by the import (BEGIN IMMEDIATE to COMMIT): ${SMALL_ROWS.toLocaleString('en')} rows ${small.lockHeldMs.toFixed(0)} ms; ${BULK_ROWS.toLocaleString('en')} rows`, value: run.lockHeldMs, unit: 'ms',
    reference: { name: `raw insert loop (the whole loop holds it) ${(floorSeconds * 1000).toFixed(0)} ms`, value: floorSeconds * 1000 },
    ratio: run.lockHeldMs / (floorSeconds * 1000), aim: 'as short as the insert alone (~1x)',
  }, {
    // That import's lock, not the first's: the table then holds 110,000 more tests, and the longest save waits for it.
    area: 'Bulk', name: `another company's saves during the same import (in a third tank; it held the write lock ${again.lockHeldMs.toFixed(0)} ms): p50 ${quantile(saves, 0.5).toFixed(0)} ms, max ${quantile(saves, 1).toFixed(0)} ms (${saves.length} saves); idle p50 ${quantile(idleSaves, 0.5).toFixed(0)} ms`, value: quantile(saves, 0.99), unit: 'ms p99',
    reference: { name: `idle p99 (${idleSaves.length} saves)`, value: quantile(idleSaves, 0.99) },
    ratio: quantile(saves, 0.99) / quantile(idleSaves, 0.99), aim: 'no company slows another (~1x)',
  }, {
    // A read takes no write lock: it waits during the import only if a save waiting for the lock holds the request loop.
    area: 'Bulk', name: `another company's reads of its tank during the same import, beside its saves: p50 ${quantile(reads, 0.5).toFixed(0)} ms, max ${quantile(reads, 1).toFixed(0)} ms (${reads.length} reads); idle, beside saves, p50 ${quantile(idleReads, 0.5).toFixed(0)} ms`, value: quantile(reads, 0.99), unit: 'ms p99',
    reference: { name: `idle p99 (${idleReads.length} reads)`, value: quantile(idleReads, 0.99) },
    ratio: quantile(reads, 0.99) / quantile(idleReads, 0.99), aim: 'no company slows another (~1x)',
  }, {
    // Until the first save the request loop's connection keeps no copy of the imported history.
    area: 'Bulk', name: `tests saved on the imported tank (${BULK_ROWS.toLocaleString('en')} tests) one after another: ${longTankSaves.map(ms => `${ms.toFixed(0)} ms`).join(', ')}; the first`, value: longTankSaves[0]!, unit: 'ms',
    reference: { name: `a save on an ordinary tank, idle p50 ${quantile(idleSaves, 0.5).toFixed(0)} ms`, value: quantile(idleSaves, 0.5) },
    ratio: longTankSaves[0]! / quantile(idleSaves, 0.5), aim: 'informative',
  }, {
    area: 'Bulk', name: `server RSS growth while importing: ${SMALL_ROWS.toLocaleString('en')} rows ${grew(small)}; ${BULK_ROWS.toLocaleString('en')} rows ${grew(run)}`, value: run.rssMost - run.rssBefore, unit: 'MiB',
    reference: { name: `${SMALL_ROWS.toLocaleString('en')} rows`, value: small.rssMost - small.rssBefore },
    ratio: (run.rssMost - run.rssBefore) / Math.max(1, small.rssMost - small.rssBefore), aim: 'flat (~1x for 10x the rows)',
  }, {
    // The first imports grow the server to its bounds; a file that still grew memory with its length would grow it again here.
    area: 'Bulk', name: `server RSS growth while importing the ${BULK_ROWS.toLocaleString('en')} rows again, into a third tank (another company saving meanwhile): ${grew(again)}`, value: again.rssMost - again.rssBefore, unit: 'MiB',
    reference: { name: `the first ${BULK_ROWS.toLocaleString('en')} rows`, value: run.rssMost - run.rssBefore },
    ratio: (again.rssMost - again.rssBefore) / Math.max(1, run.rssMost - run.rssBefore), aim: 'flat (~0x: nothing more)',
  }]
}
