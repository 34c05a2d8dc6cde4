/**
 * Shared pieces of the benchmarks: the row type every part returns, a seeded server of
 * the bench's own (built output, temporary SQLite file, loopback only) and a year of
 * readings for one tank.
 */
import { randomUUID } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { performance } from 'node:perf_hooks'
import Database from 'better-sqlite3'
import { seededDatabase } from '../tests/support/own-server'
import type { Fixtures } from '../tests/support/fixtures'
import { startServer, type RunningServer } from '../tests/support/server'

/** One line of the benchmark table. `ratio` is measured / reference, both from this run. */
export interface Row {
  area: string
  name: string
  value: number
  unit: string
  reference?: { name: string, value: number }
  ratio?: number
  aim?: string
}

export interface BenchServer {
  server: RunningServer
  dbPath: string
  dir: string
  fixtures: Fixtures
  stop: () => Promise<void>
}

/** Twice-daily readings for a year, ending yesterday, on one tank (canonical values). */
export function addYearOfReadings(dbPath: string, tankId: string, enteredBy: string, days = 365): number {
  const db = new Database(dbPath)
  const insert = db.prepare(`insert into readings (id, tank_id, taken_at, entered_by, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity, entered, created_at, updated_at)
    values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, '{}', ?, ?)`)
  const end = Date.now() - 86_400_000
  let n = 0
  db.transaction(() => {
    for (let d = days; d > 0; d--) {
      for (const hour of [8, 20]) {
        const at = new Date(end - d * 86_400_000 + hour * 3_600_000).toISOString()
        const wave = Math.max(0, Math.sin(d / 9))
        insert.run(randomUUID(), tankId, at, enteredBy, 0.4 * wave, 0.3 * wave, 2 + d / 100, 8.1, 25.4, 34.6, at, at)
        n++
      }
    }
  })()
  db.close()
  return n
}

/** Seeds a database (demo company + other company), optionally with a year of readings on the lounge tank, and starts the built server on it. */
export async function startBenchServer(options: { yearOnLounge?: boolean, env?: Record<string, string> } = {}): Promise<BenchServer> {
  const dir = mkdtempSync(join(tmpdir(), 'tidewright-bench-'))
  const { dbPath, fixtures } = await seededDatabase(dir)
  if (options.yearOnLounge) addYearOfReadings(dbPath, fixtures.demo.tanks.lounge, fixtures.demo.users.client)
  // BENCH_SERVER_NODE_ARGS (opt-in) go to the server's node alone, e.g. `--cpu-prof --cpu-prof-dir=/tmp/prof` for a profile of it under the bench.
  const nodeArgs = process.env.BENCH_SERVER_NODE_ARGS?.split(' ').filter(Boolean)
  const server = await startServer({ dbPath, nodeArgs, env: { NUXT_BENCH_ROUTES: '1', NUXT_UPLOADS_DIR: join(dir, 'uploads'), ...options.env } })
  return {
    server, dbPath, dir, fixtures,
    stop: async () => {
      await server.stop()
      rmSync(dir, { recursive: true, force: true })
    },
  }
}

/** A signed-in cookie header for the given demo user. */
export async function signInCookie(baseURL: string, email: string): Promise<string> {
  const response = await fetch(`${baseURL}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: 'tidewright-demo' }) })
  if (response.status !== 200) throw new Error(`sign-in as ${email}: ${response.status}`)
  return response.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
}

/** How many clients read in a loop at once in the isolation benchmarks. */
const READERS = 4

/** Each request's time (sorted, ms) and how many answered other than 200. */
export interface Latencies { ms: number[], failed: number }

/** A copy of the values in ascending order, for percentile. */
export function sorted(values: readonly number[]): number[] {
  return [...values].sort((a, b) => a - b)
}

/** The p-quantile of sorted values. */
export function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return Number.NaN
  return sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))]!
}

/** Loops of GETs by READERS clients until `until()` says stop; every answer other than 200 counts as failed. */
export async function readLoop(url: string, cookie: string, until: () => boolean): Promise<Latencies> {
  const result: Latencies = { ms: [], failed: 0 }
  await Promise.all(Array.from({ length: READERS }, async () => {
    while (!until()) {
      const start = performance.now()
      try {
        const response = await fetch(url, { headers: { cookie } })
        await response.arrayBuffer()
        if (response.status !== 200) result.failed++
      }
      catch {
        result.failed++
      }
      result.ms.push(performance.now() - start)
    }
  }))
  result.ms.sort((a, b) => a - b)
  return result
}

/** A loop's latencies in words, for the table. */
export const describe = (l: Latencies) => `p50 ${percentile(l.ms, 0.5).toFixed(1)} ms, p99 ${percentile(l.ms, 0.99).toFixed(1)} ms, max ${(l.ms.at(-1) ?? Number.NaN).toFixed(0)} ms, ${l.ms.length} requests, ${l.failed} failed`
