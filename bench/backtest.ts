/**
 * npm run backtest — how well the completion forecast does on histories whose ending is
 * known. Two families of tanks, each cut at every day before the engine proved the cycle;
 * the forecast from each cut is compared with the engine's own `completedOn` on the whole
 * history (found by running the engine right after each test, as the server does):
 * - simulated: the nitrification simulator (`shared/cycle/simulate`: two growing
 *   bacterial populations, kit colour steps, misreads), many seeds of a fishless cycle
 *   whose proof doses start at the first zero test, one whose proof doses start on a
 *   fixed day, a slow one, a stall and a fish-in cycle; each seed also varies the
 *   bacteria's growth rates by up to 20 % either way;
 * - synthetic: smooth textbook curves read through kit steps with noise (the curves the
 *   forecast was first tuned on, kept so a change shows on both).
 * Hit: the completion day lies inside the forecast's dates (both ends included).
 * Reproducible: the same BACKTEST_SEED and BACKTEST_SEEDS print the same figures.
 */
import { pathToFileURL } from 'node:url'
import { evaluateCycle } from '../shared/cycle/engine'
import { FORECAST_VERSION, forecastCycle } from '../shared/cycle/forecast'
import { RULE_SET_VERSION } from '../shared/cycle/registry'
import type { CycleInput } from '../shared/cycle/types'
import { simulate, simulationInput, type SimulationPlan } from '../shared/cycle/simulate'
import { simulatedFishIn, simulatedFishless, simulatedStall } from '../tests/unit/shared/cycle/forecast/simulated-tanks'
import { FISH_IN, SLOW, STALL, syntheticTank, TEXTBOOK, type CurveShape } from '../tests/unit/shared/cycle/forecast/synthetic'

const MINUTE_MS = 60_000
const HOUR_MS = 60 * MINUTE_MS
const DAY_MS = 24 * HOUR_MS
const iso = (ms: number) => new Date(ms).toISOString()

/** One tank of the back-test: its record as of any moment, and when to forecast from. */
export interface BacktestTank {
  inputAt: (now: string) => CycleInput
  /** Times of its tests, oldest first: the engine is run right after each to find the real completion. */
  testTimes: string[]
  /** Moments to forecast from, oldest first. */
  cuts: string[]
}

export type BacktestFamily = 'simulated' | 'synthetic'

export interface BacktestScenario {
  name: string
  family: BacktestFamily
  tank: (seed: number) => BacktestTank
}

function syntheticScenario(name: string, shape: CurveShape): BacktestScenario {
  return {
    name,
    family: 'synthetic',
    tank: (seed) => {
      const log = syntheticTank(shape, seed)
      const base = log.input(0)
      const days = Array.from({ length: shape.lastDay }, (_, i) => i + 1)
      return {
        inputAt: now => ({ ...base, now }),
        testTimes: log.readings.map(r => r.takenAt),
        cuts: days.map(day => log.input(day).now),
      }
    },
  }
}

function simulatedTank(plan: SimulationPlan): BacktestTank {
  const sim = simulate(plan)
  const hour = plan.testHour ?? 18
  const startMs = Date.parse(plan.start)
  // Cut before the evening's proof dose (an hour after the test): the day's test is in, its dose is not.
  const cuts = Array.from({ length: plan.days - 1 }, (_, i) => iso(startMs + (i + 1) * DAY_MS + hour * HOUR_MS + 45 * MINUTE_MS))
  return { inputAt: now => simulationInput(sim, now), testTimes: sim.tests.map(t => t.takenAt), cuts }
}

export const BACKTEST_SCENARIOS: readonly BacktestScenario[] = [
  { name: 'fishless, proof doses from the first zero', family: 'simulated', tank: seed => simulatedTank(simulatedFishless(seed, { days: 60, proof: 'prompt' })) },
  { name: 'fishless, proof doses from day 24', family: 'simulated', tank: seed => simulatedTank(simulatedFishless(seed, { days: 60, proof: 24 })) },
  { name: 'slow fishless', family: 'simulated', tank: seed => simulatedTank(simulatedFishless(seed, { days: 90, pace: 0.65, proof: 'prompt' })) },
  { name: 'stall (alkalinity not topped up)', family: 'simulated', tank: seed => simulatedTank(simulatedStall(seed)) },
  { name: 'fish-in', family: 'simulated', tank: seed => simulatedTank(simulatedFishIn(seed)) },
  syntheticScenario('textbook fishless', TEXTBOOK),
  syntheticScenario('slow cycle', SLOW),
  syntheticScenario('stall', STALL),
  syntheticScenario('fish-in', FISH_IN),
]

export interface ScenarioFigures {
  name: string
  family: BacktestFamily
  tanks: number
  /** Tanks the engine proved complete within the history. */
  proven: number
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
  ruleSetVersion: string
  seed: number
  seeds: number
  scenarios: ScenarioFigures[]
}

/** When the engine first proved the cycle (run right after each test), and the date it gave; null if it never did. */
export function realCompletion(tank: BacktestTank): { completedOn: string, knownMs: number } | null {
  for (const at of tank.testTimes) {
    const knownMs = Date.parse(at) + MINUTE_MS
    const completedOn = evaluateCycle(tank.inputAt(iso(knownMs))).completedOn
    if (completedOn !== null) return { completedOn, knownMs }
  }
  return null
}

const utcDay = (time: string) => time.slice(0, 10)

function scenarioFigures(scenario: BacktestScenario, seed: number, seeds: number): ScenarioFigures {
  const out: ScenarioFigures = { name: scenario.name, family: scenario.family, tanks: seeds, proven: 0, cuts: 0, ranges: 0, hits: 0, rangesWithoutCompletion: 0, errorsDays: [] }
  for (let i = 0; i < seeds; i += 1) {
    const tank = scenario.tank(seed * 1000 + i)
    const real = realCompletion(tank)
    if (real) out.proven += 1
    for (const cut of tank.cuts) {
      const cutMs = Date.parse(cut)
      if (real && (cutMs >= real.knownMs || cutMs >= Date.parse(real.completedOn))) break
      out.cuts += 1
      const f = forecastCycle(tank.inputAt(cut))
      if (f.status !== 'forecast' || !f.completion || !f.likely) continue
      out.ranges += 1
      if (!real) {
        out.rangesWithoutCompletion += 1
        continue
      }
      const day = utcDay(real.completedOn)
      if (utcDay(f.completion.from) <= day && day <= utcDay(f.completion.to)) out.hits += 1
      out.errorsDays.push(Math.abs(Date.parse(f.likely) - Date.parse(real.completedOn)) / DAY_MS)
    }
  }
  return out
}

/** Runs the back-test; pure and deterministic for a given seed and number of tanks per scenario. */
export function runBacktest(seed = 1, seeds = 40): BacktestFigures {
  return {
    forecastVersion: FORECAST_VERSION,
    ruleSetVersion: RULE_SET_VERSION,
    seed,
    seeds,
    scenarios: BACKTEST_SCENARIOS.map(s => scenarioFigures(s, seed, seeds)),
  }
}

/** Median of a list (NaN when empty). */
export function median(values: readonly number[]): number {
  if (!values.length) return Number.NaN
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}

/** The figures README quotes: per scenario, then per family (`simulated: all`, `synthetic: all`). */
export function summarise(figures: BacktestFigures) {
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
  const families: BacktestFamily[] = ['simulated', 'synthetic']
  return families.flatMap((family) => {
    const own = figures.scenarios.filter(s => s.family === family)
    return [...own.map(s => row(`${family}: ${s.name}`, [s])), row(`${family}: all`, own)]
  })
}

function print(figures: BacktestFigures): void {
  console.log(`Completion forecast ${figures.forecastVersion} on rule set ${figures.ruleSetVersion} — back-test, seed ${figures.seed}, ${figures.seeds} tanks per scenario`)
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
