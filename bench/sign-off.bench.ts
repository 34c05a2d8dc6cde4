/**
 * Isolation under sign-off: a decision on a tank with a very long history must not slow another
 * company. Another company's staff read their tank list (4 clients in a loop) first on an idle
 * server, then while the demo company signs off a tank of SIGN_OFF_TESTS tests, over and over
 * (asked for, approved, a test saved on the signed tank, reopened), and two browsers keep reading
 * that tank's signed record: its evidence, sign-off state and certificate, in turn. The figure is
 * the loaded p99 as a ratio of the idle p99, both measured in this run (aim: at most 3x, and not
 * one failed request); beside it the decision's answer size and time, a save on the signed tank
 * and the evidence page's time. Opt-in (`BENCH_ONLY=signoff`): not part of the default run.
 */
import { randomUUID } from 'node:crypto'
import { performance } from 'node:perf_hooks'
import { eq } from 'drizzle-orm'
import { openDatabase } from '../server/db/connection'
import { tanks } from '../server/db/schema'
import { OTHER_AQUARIST_EMAIL } from '../tests/support/fixtures'
import { copyTank } from '../tests/support/sign-off-tanks'
import { describe, percentile, readLoop, signInCookie, sorted, type BenchServer, type Row } from './support'

/** The long history's length: a 100,000-row import, the largest one file may hold. */
export const SIGN_OFF_TESTS = 100_000
const HALF_HOUR = 1_800_000
/** What a browser on the signed tank's pages asks for, in turn (under /api/tanks/:id). */
const SIGNED_RECORD_PARTS = ['/evidence', '/sign-off', '/certificate.pdf']

/**
 * A copy of the demo nano (its cycle complete) with SIGN_OFF_TESTS clean tests before its cycle
 * began, written straight into the file (as an import leaves them) before the server reads it.
 */
function longCompleteTank(bench: BenchServer): string {
  const db = openDatabase(bench.dbPath)
  try {
    const tankId = copyTank(db, bench.fixtures.demo.tanks.nano, 'Signed long reef', { status: 'cycling' })
    const started = Date.parse(db.select({ at: tanks.cycleStartedAt }).from(tanks).where(eq(tanks.id, tankId)).get()!.at!)
    const end = Math.floor((started - 2 * 86_400_000) / HALF_HOUR) * HALF_HOUR
    const insert = db.$client.prepare(`insert into readings (id, tank_id, taken_at, entered_by, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity, entered, created_at, updated_at)
      values (?, ?, ?, ?, 0, 0, 0.5, 8.1, 25, 35, '{}', ?, ?)`)
    db.$client.transaction(() => {
      for (let i = SIGN_OFF_TESTS - 1; i >= 0; i--) {
        const at = new Date(end - i * HALF_HOUR).toISOString()
        insert.run(randomUUID(), tankId, at, bench.fixtures.demo.users.aquarist, at, at)
      }
    })()
    return tankId
  }
  finally {
    db.$client.close()
  }
}

/** One timed JSON request that must answer `expected`; returns its time and the answer's size in bytes. */
async function timed(url: string, cookie: string, method: string, body: unknown, expected: number): Promise<{ ms: number, bytes: number }> {
  const start = performance.now()
  const response = await fetch(url, { method, headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify(body) })
  const bytes = (await response.arrayBuffer()).byteLength
  if (response.status !== expected) throw new Error(`${method} ${url.replace(/^.*\/api/, '/api')} answered ${response.status}, not ${expected}`)
  return { ms: performance.now() - start, bytes }
}

/** How the sign-off cycles ended: every one done, or the first step that failed (and whether the server was still up). */
function endedWith(bench: BenchServer, failure: unknown): string {
  if (!failure) return 'every cycle done'
  const exited = bench.server.process.exitCode
  const message = failure instanceof Error ? `${failure.message}${failure.cause instanceof Error ? ` (${failure.cause.message})` : ''}` : String(failure)
  return `stopped: ${message}${exited === null ? '' : `; the server exited with ${exited}: ${bench.server.output().trim().split('\n').slice(-3).join(' / ')}`}`
}

export async function runSignOffBench(bench: BenchServer, seconds: number, cycles = Number(process.env.BENCH_SIGNOFF_CYCLES ?? 3)): Promise<Row[]> {
  const { baseURL } = bench.server
  const tankId = longCompleteTank(bench)
  const tankUrl = `${baseURL}/api/tanks/${tankId}`
  const other = await signInCookie(baseURL, OTHER_AQUARIST_EMAIL)
  const aquarist = await signInCookie(baseURL, 'aquarist@tidewright.test')
  const supervisor = await signInCookie(baseURL, 'supervisor@tidewright.test')
  const browsers = [await signInCookie(baseURL, 'supervisor@tidewright.test'), await signInCookie(baseURL, 'admin@tidewright.test')]
  // The long tank's first verdict (in the pool) before anything is timed.
  if ((await fetch(`${tankUrl}/verdict`, { headers: { cookie: aquarist } })).status !== 200) throw new Error('the long tank has no verdict')
  const otherUrl = `${baseURL}/api/tanks`
  const warmEnd = performance.now() + 500
  const warm = await readLoop(otherUrl, other, () => performance.now() > warmEnd)
  if (warm.failed) throw new Error(`the other company's tank list failed ${warm.failed} times before the benchmark`)
  const idleEnd = performance.now() + seconds * 1000
  const idle = await readLoop(otherUrl, other, () => performance.now() > idleEnd)

  let heavyDone = false
  const decisions: { ms: number, bytes: number }[] = []
  const saves: number[] = []
  let failure: unknown
  const heavy = (async () => {
    try {
      await signOffCycles()
    }
    catch (error) {
      failure = error
    }
    heavyDone = true
  })()
  async function signOffCycles(): Promise<void> {
    for (let cycle = 0; cycle < cycles; cycle++) {
      await timed(`${tankUrl}/sign-off-requests`, aquarist, 'POST', { note: 'Imported log and the cycle since.' }, 201)
      decisions.push(await timed(`${tankUrl}/sign-off/decision`, supervisor, 'POST', { decision: 'approve' }, 200))
      const save = { takenAt: new Date().toISOString(), ammonia: 0, nitrite: 0, nitrate: 0.5, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical' }
      saves.push((await timed(`${tankUrl}/readings`, aquarist, 'POST', save, 201)).ms)
      await timed(`${tankUrl}/sign-off/reopen`, supervisor, 'POST', { reason: 'Signed again for the benchmark.' }, 200)
    }
  }
  // The signed record read while it is being decided: 404 for a certificate with no approval standing is an answer, not a failure.
  const evidenceMs: number[] = []
  const pageLoads = Promise.all(browsers.map(async (cookie) => {
    let loads = 0
    let failed = 0
    while (!heavyDone) {
      const part = SIGNED_RECORD_PARTS[loads % SIGNED_RECORD_PARTS.length]!
      const start = performance.now()
      const status = await fetch(`${tankUrl}${part}`, { headers: { cookie } }).then(async (response) => {
        await response.arrayBuffer()
        return response.status
      }, () => 0)
      if (part === '/evidence') evidenceMs.push(performance.now() - start)
      if (status === 200 || (part === '/certificate.pdf' && status === 404)) loads++
      else failed++
    }
    return { loads, failed }
  }))
  const loaded = await readLoop(otherUrl, other, () => heavyDone)
  await heavy
  const pages = await pageLoads
  const pageCount = pages.reduce((n, e) => n + e.loads, 0)
  const pageFailed = pages.reduce((n, e) => n + e.failed, 0)
  const decisionMs = sorted(decisions.map(d => d.ms))
  const evidence = sorted(evidenceMs)
  const savesSorted = sorted(saves)
  const long = `${SIGN_OFF_TESTS.toLocaleString('en')}-test tank`
  return [
    {
      area: 'Sign-off',
      name: `other company's GET /api/tanks while a ${long} is signed off ${cycles} times (asked, approved, a test saved, reopened: ${endedWith(bench, failure)}) and ${pageCount} reads of its evidence, sign-off and certificate (${pageFailed} failed): ${describe(loaded)}`,
      value: percentile(loaded.ms, 0.99), unit: 'ms p99',
      reference: { name: `idle: ${describe(idle)}`, value: percentile(idle.ms, 0.99) },
      ratio: percentile(loaded.ms, 0.99) / percentile(idle.ms, 0.99), aim: '<= 3.0, 0 failed',
    },
    { area: 'Sign-off', name: `decision's answer on the ${long} (approve), ${decisions.length} decided`, value: Math.max(...decisions.map(d => d.bytes)) / 1000, unit: 'kB' },
    { area: 'Sign-off', name: `decision on the ${long}: p50 / max ${percentile(decisionMs, 0.5).toFixed(0)} / ${(decisionMs.at(-1) ?? Number.NaN).toFixed(0)} ms`, value: percentile(decisionMs, 0.5), unit: 'ms p50' },
    { area: 'Sign-off', name: `a test saved on the signed ${long}: p50 / max ${percentile(savesSorted, 0.5).toFixed(0)} / ${(savesSorted.at(-1) ?? Number.NaN).toFixed(0)} ms`, value: percentile(savesSorted, 0.5), unit: 'ms p50' },
    { area: 'Sign-off', name: `its evidence page while it is decided: p50 / p99 ${percentile(evidence, 0.5).toFixed(0)} / ${percentile(evidence, 0.99).toFixed(0)} ms, ${evidence.length} loads`, value: percentile(evidence, 0.5), unit: 'ms p50' },
  ]
}
