/**
 * npm run bench — every benchmark in one run, printed as ONE table: each figure beside
 * the reference it is compared with, measured in the same run on this machine, and the
 * ratio. Nothing here asserts a time; the table is for people (and README's figures).
 * Loopback only. BENCH_SECONDS (default 4) sets the length of each API case;
 * BENCH_ONLY=api,bulk,isolation,engine,frontend,backtest runs a subset (frontend: the first chart over FIRST_CHART_LOADS
 * desktop loads, and Lighthouse's mobile performance figures for three pages, lighthouse runs those alone, LIGHTHOUSE_RUNS each; backtest: the completion
 * forecast's hit rate and median error, the same figures as npm run backtest). Opt-in only, never in
 * the default run: signoff (another company's reads while a 100,000-test tank is signed off again
 * and again, sign-off.bench.ts; BENCH_SIGNOFF_CYCLES, default 3).
 */
import { existsSync } from 'node:fs'
import { cpus } from 'node:os'
import { execSync } from 'node:child_process'
import { runApiBench } from './api.bench'
import { runBacktest, summarise } from './backtest'
import { runBulkBench } from './bulk.bench'
import { runEngineBench } from './engine.bench'
import { runFrontendBench } from './frontend.bench'
import { runIsolationBench } from './isolation.bench'
import { runLighthouseBench } from './lighthouse.bench'
import { runSignOffBench } from './sign-off.bench'
import { startBenchServer, type Row } from './support'
import { buildIsStale } from '../scripts/build-state.mjs'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 4)
const ONLY = new Set((process.env.BENCH_ONLY ?? 'api,bulk,isolation,engine,frontend,backtest').split(','))

function fmt(n: number): string {
  if (!Number.isFinite(n)) return 'n/a'
  return n >= 100 ? n.toFixed(0) : n >= 10 ? n.toFixed(1) : n.toFixed(2)
}

function print(rows: Row[]): void {
  const head = ['area', 'case', 'value', 'unit', 'ratio', 'aim', 'reference (same run)']
  const body = rows.map(r => [r.area, r.name, fmt(r.value), r.unit, r.ratio === undefined ? '' : r.ratio.toFixed(2), r.aim ?? '', r.reference?.name ?? ''])
  const widths = head.map((h, i) => Math.max(h.length, ...body.map(b => b[i]!.length)))
  const line = (cells: string[]) => `| ${cells.map((c, i) => (i === 2 || i === 4 ? c.padStart(widths[i]!) : c.padEnd(widths[i]!))).join(' | ')} |`
  console.log(line(head))
  console.log(`|${widths.map(w => '-'.repeat(w + 2)).join('|')}|`)
  for (const b of body) console.log(line(b))
}

async function main() {
  if (buildIsStale()) execSync('npx nuxt build', { stdio: 'inherit' })
  console.log(`Tidewright benchmarks — ${cpus().length} cores (${cpus()[0]?.model ?? 'unknown CPU'}), Node ${process.versions.node}, ${new Date().toISOString()}`)
  const rows: Row[] = []
  if (ONLY.has('engine')) {
    for (const r of await runEngineBench()) rows.push({ area: 'Engine', name: r.name, value: r.value, unit: r.unit === 'ratio' ? 'x' : r.unit })
    if (existsSync(new URL('./tank-page.bench.ts', import.meta.url))) {
      const { runTankPageBench } = await import('./tank-page.bench') as { runTankPageBench: () => Promise<{ name: string, value: number, unit: string }[]> }
      // It prints its own lines as well; keep this run to one table.
      const log = console.log
      console.log = () => {}
      const results = await runTankPageBench().finally(() => {
        console.log = log
      })
      for (const r of results) rows.push({ area: 'Tank page', name: r.name, value: r.value, unit: r.unit === 'ratio' ? 'x' : r.unit })
    }
  }
  if (ONLY.has('api') || ONLY.has('frontend') || ONLY.has('lighthouse')) {
    const bench = await startBenchServer({ yearOnLounge: true })
    try {
      if (ONLY.has('frontend')) rows.push(...await runFrontendBench(bench), ...await runLighthouseBench(bench))
      else if (ONLY.has('lighthouse')) rows.push(...await runLighthouseBench(bench))
      if (ONLY.has('api')) rows.push(...await runApiBench(bench, SECONDS))
    }
    finally {
      await bench.stop()
    }
  }
  if (ONLY.has('bulk')) {
    const bench = await startBenchServer()
    try {
      rows.push(...await runBulkBench(bench))
    }
    finally {
      await bench.stop()
    }
  }
  if (ONLY.has('isolation')) {
    const bench = await startBenchServer()
    try {
      rows.push(...await runIsolationBench(bench, SECONDS))
    }
    finally {
      await bench.stop()
    }
  }
  if (ONLY.has('signoff')) {
    const bench = await startBenchServer()
    try {
      rows.push(...await runSignOffBench(bench, SECONDS))
    }
    finally {
      await bench.stop()
    }
  }
  if (ONLY.has('backtest')) {
    for (const r of summarise(runBacktest(Number(process.env.BACKTEST_SEED ?? 1), Number(process.env.BACKTEST_SEEDS ?? 40)))) {
      if (Number.isNaN(r.hitRate)) continue
      rows.push({ area: 'Forecast', name: `${r.name}: ranges holding the completion (80 % aimed)`, value: r.hitRate * 100, unit: '%', aim: '~80 %' })
      rows.push({ area: 'Forecast', name: `${r.name}: median error of the likely day`, value: r.medianErrorDays, unit: 'days' })
    }
  }
  print(rows)
}

await main()
