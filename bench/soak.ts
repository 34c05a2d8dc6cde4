/**
 * npm run soak — a load soak, not part of npm test. 64 simulated users for 2 minutes
 * against the built server on loopback: 48 clients entering readings on their tanks and
 * 16 staff reading dashboards (tank list, tank, readings, verdict, chart). Passes when
 * no request got a 5xx, SQLITE_BUSY never surfaced (in answers or the server log) and
 * the server's resident memory stayed flat (sampled from /proc). Every loop stops by
 * itself at the deadline. SOAK_SECONDS (default 120) and SOAK_USERS (default 64) adjust it.
 */
import { readFileSync } from 'node:fs'
import { signInCookie, startBenchServer } from './support'

const SECONDS = Number(process.env.SOAK_SECONDS ?? 120)
const USERS = Number(process.env.SOAK_USERS ?? 64)
/** RSS may grow this much from the first sampled quarter (after warm-up) to the last before it counts as not flat. */
const FLAT_TOLERANCE = 0.25

const sleep = (ms: number) => new Promise(resolve => setTimeout(resolve, ms))
const jitter = (min: number, max: number) => min + Math.random() * (max - min)

function rssKiB(pid: number): number {
  const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))
  return match ? Number(match[1]) : Number.NaN
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.floor(sorted.length / 2)] ?? Number.NaN
}

async function main() {
  const bench = await startBenchServer({ yearOnLounge: true })
  const { baseURL } = bench.server
  const { demo } = bench.fixtures
  const pid = bench.server.process.pid!
  const stats = { requests: 0, byStatus: new Map<number, number>(), busy: 0, networkErrors: 0, readingsSaved: 0 }
  const deadline = Date.now() + SECONDS * 1000
  try {
    const entrants = [
      { email: 'client@tidewright.test', tanks: [demo.tanks.lounge, demo.tanks.lobby] },
      { email: 'client2@tidewright.test', tanks: [demo.tanks.nano] },
      { email: 'client3@tidewright.test', tanks: [demo.tanks.study] },
      { email: 'aquarist@tidewright.test', tanks: [demo.tanks.lounge, demo.tanks.study] },
    ]
    const staff = ['aquarist@tidewright.test', 'aquarist2@tidewright.test', 'supervisor@tidewright.test', 'admin@tidewright.test']
    const cookies = new Map<string, string>()
    for (const email of new Set([...entrants.map(e => e.email), ...staff])) cookies.set(email, await signInCookie(baseURL, email))

    async function call(method: string, path: string, cookie: string, body?: unknown): Promise<void> {
      try {
        const response = await fetch(`${baseURL}${path}`, { method, headers: { cookie, 'content-type': 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) })
        const text = await response.text()
        stats.requests++
        stats.byStatus.set(response.status, (stats.byStatus.get(response.status) ?? 0) + 1)
        if (/SQLITE_BUSY|database is locked/i.test(text)) stats.busy++
        if (response.status === 201 && path.endsWith('/readings')) stats.readingsSaved++
      }
      catch {
        stats.networkErrors++
      }
    }

    const clientLoop = async (i: number) => {
      const who = entrants[i % entrants.length]!
      const cookie = cookies.get(who.email)!
      while (Date.now() < deadline) {
        const tank = who.tanks[Math.floor(Math.random() * who.tanks.length)]!
        await call('POST', `/api/tanks/${tank}/readings`, cookie, {
          takenAt: new Date(Date.now() - jitter(60_000, 3_600_000)).toISOString(),
          ammonia: Math.round(jitter(0, 1) * 100) / 100, nitrite: Math.round(jitter(0, 1) * 100) / 100, nitrate: Math.round(jitter(0, 20)),
          basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, pH: 8.1, temperature: 25.5, temperatureUnit: 'C', salinity: 34.8, salinityMode: 'practical',
          notes: `soak ${i}`,
        })
        await call('GET', `/api/tanks/${tank}/readings?pageSize=10`, cookie)
        await sleep(jitter(200, 1200))
      }
    }
    const staffLoop = async (i: number) => {
      const cookie = cookies.get(staff[i % staff.length]!)!
      const tanks = Object.values(demo.tanks)
      while (Date.now() < deadline) {
        const tank = tanks[Math.floor(Math.random() * tanks.length)]!
        await call('GET', '/api/tanks', cookie)
        await call('GET', `/api/tanks/${tank}`, cookie)
        await call('GET', `/api/tanks/${tank}/verdict`, cookie)
        await call('GET', `/api/tanks/${tank}/chart`, cookie)
        await call('GET', `/api/tanks/${tank}/readings`, cookie)
        await sleep(jitter(100, 600))
      }
    }

    const samples: { at: number, rss: number }[] = []
    const sampler = (async () => {
      while (Date.now() < deadline) {
        samples.push({ at: Date.now(), rss: rssKiB(pid) })
        await sleep(2000)
      }
    })()
    const staffCount = Math.round(USERS / 4)
    console.log(`Soak: ${USERS - staffCount} clients entering readings, ${staffCount} staff on dashboards, ${SECONDS} s against ${baseURL}`)
    await Promise.all([
      ...Array.from({ length: USERS - staffCount }, (_, i) => clientLoop(i)),
      ...Array.from({ length: staffCount }, (_, i) => staffLoop(i)),
      sampler,
    ])

    const quarter = Math.max(1, Math.floor(samples.length / 4))
    const early = median(samples.slice(quarter, 2 * quarter).map(s => s.rss))
    const late = median(samples.slice(-quarter).map(s => s.rss))
    const growth = (late - early) / early
    const fiveXX = [...stats.byStatus].filter(([s]) => s >= 500).reduce((n, [, c]) => n + c, 0)
    const logBusy = /SQLITE_BUSY|database is locked/i.test(bench.server.output())
    const table = [
      ['requests', String(stats.requests)],
      ['requests/s', (stats.requests / SECONDS).toFixed(1)],
      ['readings saved', String(stats.readingsSaved)],
      ['statuses', [...stats.byStatus].sort(([a], [b]) => a - b).map(([s, c]) => `${s}: ${c}`).join(', ')],
      ['5xx', String(fiveXX)],
      ['SQLITE_BUSY surfaced', String(stats.busy + (logBusy ? 1 : 0))],
      ['network errors', String(stats.networkErrors)],
      ['server RSS (MiB): after warm-up -> end, peak', `${(early / 1024).toFixed(0)} -> ${(late / 1024).toFixed(0)}, ${(Math.max(...samples.map(s => s.rss)) / 1024).toFixed(0)} (${(growth * 100).toFixed(1)} %)`],
    ]
    for (const [k, v] of table) console.log(`${k!.padEnd(46)} ${v}`)
    const failures = [
      fiveXX > 0 && `${fiveXX} answers were 5xx`,
      (stats.busy > 0 || logBusy) && 'SQLITE_BUSY surfaced',
      stats.networkErrors > 0 && `${stats.networkErrors} requests failed on the network`,
      !(growth <= FLAT_TOLERANCE) && `memory grew ${(growth * 100).toFixed(1)} % after warm-up`,
    ].filter(Boolean)
    console.log(failures.length ? `SOAK FAILED: ${failures.join('; ')}` : 'Soak passed: no 5xx, no SQLITE_BUSY, memory flat.')
    process.exitCode = failures.length ? 1 : 0
  }
  finally {
    await bench.stop()
  }
}

await main()
