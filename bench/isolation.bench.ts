/**
 * Isolation: one company's heavy work must not slow another's. Another company's staff
 * read their tank list (4 clients in a loop) first on an idle server, then while the demo
 * company imports 100,000 readings (and the verdict refresh that follows) and two browsers
 * keep reloading that tank's pages: its evidence, chart, sign-off, forecast, verdict and
 * summary, in turn (once the import is in, a tank of 100,000 tests). The figure is the loaded p99 as a ratio of the
 * idle p99, both measured in this run. Aim: at most 3x, and not one failed request.
 */
import { performance } from 'node:perf_hooks'
import { OTHER_AQUARIST_EMAIL } from '../tests/support/fixtures'
import { bulkCsv, BULK_ROWS } from './bulk.bench'
import { describe, percentile, readLoop, signInCookie, type BenchServer, type Row } from './support'

/** What a browser on the imported tank's pages asks for, in turn (under /api/tanks/:id). */
const TANK_PAGE_PARTS = ['/evidence', '/chart', '/sign-off', '/forecast', '/verdict', '']

export async function runIsolationBench(bench: BenchServer, seconds: number): Promise<Row[]> {
  const { baseURL } = bench.server
  const other = await signInCookie(baseURL, OTHER_AQUARIST_EMAIL)
  const importer = await signInCookie(baseURL, 'aquarist@tidewright.test')
  const browsers = [await signInCookie(baseURL, 'aquarist@tidewright.test'), await signInCookie(baseURL, 'admin@tidewright.test')]
  const otherUrl = `${baseURL}/api/tanks`
  const warm = await readLoop(otherUrl, other, (() => {
    const end = performance.now() + 500
    return () => performance.now() > end
  })())
  if (warm.failed) throw new Error(`the other company's tank list failed ${warm.failed} times before the benchmark`)

  const idleEnd = performance.now() + seconds * 1000
  const idle = await readLoop(otherUrl, other, () => performance.now() > idleEnd)

  const created = await fetch(`${baseURL}/api/tanks`, {
    method: 'POST', headers: { 'cookie': importer, 'content-type': 'application/json' },
    body: JSON.stringify({ name: 'Isolation import reef', clientId: bench.fixtures.demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 1200, widthMm: 500, heightMm: 550 } }),
  })
  if (created.status !== 201) throw new Error(`creating the import tank: ${created.status}`)
  const tankId = (await created.json()).id as string
  const { csv } = bulkCsv(BULK_ROWS)

  let heavyDone = false
  const loadStart = performance.now()
  const stop = () => heavyDone && performance.now() - loadStart > seconds * 1000
  const heavy = (async () => {
    const response = await fetch(`${baseURL}/api/tanks/${tankId}/readings/import`, {
      method: 'POST', headers: { 'cookie': importer, 'content-type': 'application/json' },
      body: JSON.stringify({ csv, dryRun: false, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical' }),
    })
    const text = await response.text()
    if (response.status !== 200) throw new Error(`import answered ${response.status}: ${text.slice(0, 300)}`)
    // The verdict refresh runs after the answer; this read is served once it is done.
    await (await fetch(`${baseURL}/api/tanks/${tankId}/verdict`, { headers: { cookie: importer } })).arrayBuffer()
    const seconds = (performance.now() - loadStart) / 1000
    heavyDone = true
    return seconds
  })()
  const pageLoads = Promise.all(browsers.map(async (cookie) => {
    let loads = 0
    let failed = 0
    while (!stop()) {
      const part = TANK_PAGE_PARTS[(loads + failed) % TANK_PAGE_PARTS.length]
      const response = await fetch(`${baseURL}/api/tanks/${tankId}${part}`, { headers: { cookie } })
      await response.arrayBuffer()
      if (response.status === 200) loads++
      else failed++
    }
    return { loads, failed }
  }))
  const loaded = await readLoop(otherUrl, other, stop)
  const importSeconds = await heavy
  const pages = await pageLoads
  const pageCount = pages.reduce((n, e) => n + e.loads, 0)
  const pageFailed = pages.reduce((n, e) => n + e.failed, 0)
  const ratio = percentile(loaded.ms, 0.99) / percentile(idle.ms, 0.99)
  return [{
    area: 'Isolation',
    name: `other company's GET /api/tanks during a ${BULK_ROWS.toLocaleString('en')}-row import (${importSeconds.toFixed(1)} s with its verdict refresh) and ${pageCount} loads of that tank's pages (${pageFailed} failed): ${describe(loaded)}`,
    value: percentile(loaded.ms, 0.99), unit: 'ms p99',
    reference: { name: `idle: ${describe(idle)}`, value: percentile(idle.ms, 0.99) },
    ratio, aim: '<= 3.0, 0 failed',
  }]
}
