/**
 * Lighthouse's performance figures (mobile profile: its default simulated slow 4G and 4x CPU
 * slowdown, Moto G Power screen) for the sign-in page, a client's tank page with a year of
 * readings and the aquarist's attention board, in Debian's Chromium. A signed-in page gets its
 * session as a Cookie header on every request, so Lighthouse's cold-cache reset keeps it.
 */
import lighthouse from 'lighthouse'
import { launch } from 'chrome-launcher'
import type { BenchServer, Row } from './support'
import { signInCookie } from './support'

const CHROMIUM = process.env.CHROMIUM_PATH || '/usr/bin/chromium'

/** Runs per page (LIGHTHOUSE_RUNS, default 3); the median by score is reported. */
const RUNS = Math.max(1, Number(process.env.LIGHTHOUSE_RUNS ?? 3))

interface PageCase { name: string, path: string, as?: string }
type LighthouseResult = NonNullable<Awaited<ReturnType<typeof lighthouse>>>['lhr']

/** One Lighthouse run; a run whose trace came back broken (it happens under load) is tried up to twice more. */
async function measure(port: number, url: string, cookie: string | undefined, attempt = 1): Promise<LighthouseResult> {
  const result = await lighthouse(url, {
    port,
    onlyCategories: ['performance'],
    output: 'json',
    logLevel: 'error',
    extraHeaders: cookie ? { Cookie: cookie } : undefined,
  })
  if (!result) throw new Error(`Lighthouse gave no result for ${url}`)
  if (result.lhr.runtimeError) {
    if (attempt < 3) return measure(port, url, cookie, attempt + 1)
    throw new Error(`Lighthouse on ${url}: ${result.lhr.runtimeError.message}`)
  }
  return result.lhr
}

export async function runLighthouseBench(bench: BenchServer): Promise<Row[]> {
  const cases: PageCase[] = [
    { name: 'sign-in page', path: '/login' },
    { name: 'tank page (client, year of data)', path: `/tanks/${bench.fixtures.demo.tanks.lounge}`, as: 'client@tidewright.test' },
    { name: 'attention board (aquarist)', path: '/', as: 'aquarist@tidewright.test' },
  ]
  const chrome = await launch({ chromePath: CHROMIUM, chromeFlags: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--no-first-run'] })
  const rows: Row[] = []
  try {
    for (const c of cases) {
      const cookie = c.as ? await signInCookie(bench.server.baseURL, c.as) : undefined
      const runs: LighthouseResult[] = []
      for (let i = 0; i < RUNS; i++) runs.push(await measure(chrome.port, `${bench.server.baseURL}${c.path}`, cookie))
      // Lighthouse's score moves by a few points from run to run; the median run is reported.
      runs.sort((a, b) => (a.categories.performance?.score ?? 0) - (b.categories.performance?.score ?? 0))
      const lhr = runs[Math.floor(runs.length / 2)]!
      // A signed-in page that ended on the sign-in form measured the wrong page.
      if (c.as && new URL(lhr.finalDisplayedUrl).pathname.startsWith('/login')) throw new Error(`Lighthouse on ${c.path} ended at ${lhr.finalDisplayedUrl}`)
      const audit = (id: string) => lhr.audits[id]?.numericValue ?? Number.NaN
      const score = (lhr.categories.performance?.score ?? Number.NaN) * 100
      rows.push({ area: 'Lighthouse', name: `${c.name}: performance score (median of ${RUNS})`, value: score, unit: '/ 100', aim: '>= 90' })
      rows.push({ area: 'Lighthouse', name: `${c.name}: first contentful paint`, value: audit('first-contentful-paint'), unit: 'ms' })
      rows.push({ area: 'Lighthouse', name: `${c.name}: largest contentful paint`, value: audit('largest-contentful-paint'), unit: 'ms' })
      rows.push({ area: 'Lighthouse', name: `${c.name}: total blocking time`, value: audit('total-blocking-time'), unit: 'ms' })
      rows.push({ area: 'Lighthouse', name: `${c.name}: main-thread work`, value: audit('mainthread-work-breakdown'), unit: 'ms' })
      rows.push({ area: 'Lighthouse', name: `${c.name}: savings left by compression`, value: (lhr.audits['uses-text-compression']?.details as { overallSavingsBytes?: number } | undefined)?.overallSavingsBytes ?? 0, unit: 'bytes' })
      rows.push({ area: 'Lighthouse', name: `${c.name}: unused JavaScript`, value: ((lhr.audits['unused-javascript']?.details as { overallSavingsBytes?: number } | undefined)?.overallSavingsBytes ?? 0) / 1024, unit: 'KiB' })
    }
  }
  finally {
    chrome.kill()
  }
  return rows
}
