/**
 * npm run backtest — how well the completion forecast does on histories whose ending is
 * known. Each simulated tank (many seeds of a textbook fishless, a slow, a stalled and a
 * fish-in cycle) is cut at every day before the engine proved it complete; the forecast
 * from each cut is compared with the engine's own `completedOn` on the whole history.
 * Hit: the completion day lies inside the forecast's dates (both ends included).
 * Reproducible: the same BACKTEST_SEED and BACKTEST_SEEDS print the same figures.
 */
import { pathToFileURL } from 'node:url'
import { evaluateCycle } from '../shared/cycle/engine'
import { FORECAST_VERSION, forecastCycle } from '../shared/cycle/forecast'
import { FISH_IN, SLOW, STALL, syntheticTank, TEXTBOOK, type CurveShape } from '../tests/unit/shared/cycle/forecast/synthetic'

const DAY_MS = 86_400_000

export const BACKTEST_SCENARIOS: ReadonlyArray<{ name: string, shape: CurveShape }> = [
  { name: 'textbook fishless', shape: TEXTBOOK },
  { name: 'slow cycle', shape: SLOW },
  { name: 'stall', shape: STALL },
  { name: 'fish-in', shape: FISH_IN },
]

export interface ScenarioFigures {
  name: string
  tanks: number
  /** Daily cuts before the proof (every day for a tank never proven). */
  cuts: number
  /** Cuts that got a range. */
  ranges: number
  /** Ranges that held the real completion day. */
  hits: number
  /** Ranges given for a tank the engine never proved (a stall): each one is a miss. */
  rangesWithoutCompletion: number
  /** Absolute days between the most likely day and the real completion, per range. */
  errorsDays: number[]
}

export interface BacktestFigures {
  forecastVersion: string
  seed: number
  seeds: number
  scenarios: ScenarioFigures[]
}

const utcDay = (iso: string) => iso.slice(0, 10)

function scenarioFigures(name: string, shape: CurveShape, seed: number, seeds: number): ScenarioFigures {
  const out: ScenarioFigures = { name, tanks: seeds, cuts: 0, ranges: 0, hits: 0, rangesWithoutCompletion: 0, errorsDays: [] }
  for (let i = 0; i < seeds; i += 1) {
    const log = syntheticTank(shape, seed * 1000 + i)
    const completedOn = evaluateCycle(log.input(shape.lastDay + 1)).completedOn
    for (let day = 1; day <= shape.lastDay; day += 1) {
      const input = log.input(day)
      if (completedOn !== null && input.now >= completedOn) break
      out.cuts += 1
      const f = forecastCycle(input)
      if (f.status !== 'forecast') continue
      out.ranges += 1
      if (completedOn === null) {
        out.rangesWithoutCompletion += 1
        continue
      }
      if (utcDay(f.completion!.from) <= utcDay(completedOn) && utcDay(completedOn) <= utcDay(f.completion!.to)) out.hits += 1
      out.errorsDays.push(Math.abs(Date.parse(f.likely!) - Date.parse(completedOn)) / DAY_MS)
    }
  }
  return out
}

/** Runs the back-test; pure and deterministic for a given seed and number of tanks per scenario. */
export function runBacktest(seed = 1, seeds = 40): BacktestFigures {
  return { forecastVersion: FORECAST_VERSION, seed, seeds, scenarios: BACKTEST_SCENARIOS.map(s => scenarioFigures(s.name, s.shape, seed, seeds)) }
}

/** Median of a list (NaN when empty). */
export function median(values: readonly number[]): number {
  if (!values.length) return Number.NaN
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}

/** The figures README quotes: per scenario and overall. */
export function summarise(figures: BacktestFigures) {
  const all = figures.scenarios
  const row = (name: string, s: readonly ScenarioFigures[]) => {
    const ranges = s.reduce((n, x) => n + x.ranges, 0)
    const hits = s.reduce((n, x) => n + x.hits, 0)
    return {
      name,
      cuts: s.reduce((n, x) => n + x.cuts, 0),
      ranges,
      hitRate: ranges ? hits / ranges : Number.NaN,
      medianErrorDays: median(s.flatMap(x => x.errorsDays)),
      rangesWithoutCompletion: s.reduce((n, x) => n + x.rangesWithoutCompletion, 0),
    }
  }
  return [...all.map(s => row(s.name, [s])), row('all', all)]
}

function print(figures: BacktestFigures): void {
  console.log(`Completion forecast ${figures.forecastVersion} back-test — seed ${figures.seed}, ${figures.seeds} tanks per scenario`)
  const head = ['scenario', 'cuts', 'ranges', 'hit rate', 'median error (days)', 'ranges for a tank never proven']
  const body = summarise(figures).map(r => [r.name, String(r.cuts), String(r.ranges), Number.isNaN(r.hitRate) ? 'n/a' : `${(r.hitRate * 100).toFixed(1)} %`, Number.isNaN(r.medianErrorDays) ? 'n/a' : r.medianErrorDays.toFixed(1), String(r.rangesWithoutCompletion)])
  const widths = head.map((h, i) => Math.max(h.length, ...body.map(b => b[i]!.length)))
  const line = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(widths[i]!)).join(' | ')} |`
  console.log(line(head))
  console.log(`|${widths.map(w => '-'.repeat(w + 2)).join('|')}|`)
  for (const b of body) console.log(line(b))
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  print(runBacktest(Number(process.env.BACKTEST_SEED ?? 1), Number(process.env.BACKTEST_SEEDS ?? 40)))
}
