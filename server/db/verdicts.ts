/**
 * Runs the rule engine for one tank and stores the verdict, so lists and dashboards
 * read the phase without recomputing. Framework-free: the server, the seed and the
 * tests share it.
 */
import { eq, inArray, isNull, sql } from 'drizzle-orm'
import { evaluateCycle, evaluatePrepared } from '../../shared/cycle/engine'
import type { PreparedInput } from '../../shared/cycle/history'
import { CURRENT_RULE_OPTIONS } from '../../shared/cycle/options'
import { FORECAST_VERSION, forecastPrepared } from '../../shared/cycle/forecast'
import type { CycleInput, CycleTank, Thresholds, Verdict } from '../../shared/cycle/types'
import type { CycleForecast } from '../../shared/cycle/forecast'
import type { Db } from './connection'
import { preparedPerDb } from './prepared'
import { keptHistory, readEngineInput, streamedInput } from '../domain/readings/engine-input-cache'
import { HISTORY_WINDOW_DAYS, streamsHistory } from '../domain/tanks/long-history'
import { BeyondWindow } from '../../shared/cycle/window'
import type { StreamedInputHead } from '../../shared/cycle/history-stream'
import { tankDataRevisionInDb } from '../domain/readings/data-revision'
import { tankVerdicts, tanks } from './schema'
import { readOrganisationSettings } from './settings'

/** The tank's row, prepared once. */
const tankById = preparedPerDb(db => db.select().from(tanks).where(eq(tanks.id, sql.placeholder('tankId'))).prepare())

/** What the engine reads besides the tank's history and `now`: the tank's profile and its company's thresholds. */
export interface EngineSettings {
  tank: CycleTank
  thresholds: Partial<Thresholds>
}

/** The engine input as cycleInputFor builds it: its thresholds always read from the company. */
export type TankCycleInput = CycleInput & EngineSettings

/**
 * What the engine reads of a tank's profile and its company's limits, or undefined if there is no
 * such tank: the one builder of that part of every engine input (a sign-off compares it, read
 * again, with the one its verdict was made under).
 */
export function engineSettingsFor(db: Db, tankId: string): EngineSettings | undefined {
  const tank = tankById(db).get({ tankId })
  if (!tank) return undefined
  const { thresholds } = readOrganisationSettings(db, tank.organisationId)
  return { tank: { volumeLitres: tank.volumeLitres + tank.sumpLitres, cycleMethod: tank.cycleMethod, startedAt: tank.cycleStartedAt ?? tank.createdAt }, thresholds }
}

/**
 * The engine input for a tank as the database holds it now, read anew (a sign-off records it), or
 * undefined if there is no such tank. A correction replaces the entry it corrects; the engine
 * sees only the current value.
 */
export function cycleInputFor(db: Db, tankId: string, now: Date): TankCycleInput | undefined {
  const found = engineSettingsFor(db, tankId)
  return found && { ...found, ...readEngineInput(db, tankId), now: now.toISOString() }
}

/**
 * Evaluates the tank's cycle now and stores the verdict with the completion forecast made from
 * the same input at the same time (lists read it instead of the tank's history); undefined if
 * the tank does not exist. The engine starts from the tank's kept history (parsed and ordered
 * once, a new test placed into it), which gives the verdict the rows alone give.
 */
export function computeAndStoreVerdict(db: Db, tankId: string, now = new Date()): Verdict | undefined {
  const evaluation = evaluateTankNow(db, tankId, now)
  if (!evaluation) return undefined
  storeVerdict(db, tankId, evaluation, now.toISOString())
  return evaluation.verdict
}

/**
 * The tank's engine input as the database holds it at `now` and its verdict, made from that very
 * input (a sign-off decides on it and records the input); undefined if there is no such tank.
 */
export function verdictWithInput(db: Db, tankId: string, now: Date): { input: TankCycleInput, verdict: Verdict } | undefined {
  const input = cycleInputFor(db, tankId, now)
  return input && { input, verdict: evaluateCycle(input, CURRENT_RULE_OPTIONS) }
}

/**
 * The tank's verdict and forecast as of `now` from its data as the database holds it (here, or
 * in a worker thread), undefined if there is no such tank. The engine and the forecast share
 * the tank's kept history, so neither parses and orders the tests again; for a tank past
 * STREAMED_HISTORY_TESTS that is its fold held for HISTORY_WINDOW_DAYS (long-history.ts), and
 * the whole history only when the window cannot settle them.
 */
export function evaluateTankNow(db: Db, tankId: string, now: Date): TankEvaluation | undefined {
  // The tank's profile and thresholds, read once: the fold and, when it cannot settle the
  // verdict, the whole history are judged under the same ones.
  const settings = engineSettingsFor(db, tankId)
  if (!settings) return undefined
  const head = { ...settings, now: now.toISOString() }
  // The tank's count of changes, read once, before any of its rows: it labels whichever copy is
  // kept (the fold, or the whole history read when the fold cannot settle the verdict). Inside a
  // transaction (the demo seed's) every read sees one snapshot: the count is exactly that of the
  // rows. Outside one (the loop's and the pool's connections: each statement sees the latest
  // commit) a write on another connection may land between the count and the rows, or between the
  // fold and the whole read; the copy then holds rows newer than its label, never older. That is
  // safe: the next evaluation finds the count moved and reads again, and a test the copy is told
  // of that it already holds is refused (withTestAppended, withReadingAdded), which drops it.
  // Reading the count again before the whole read would only label that copy more tightly;
  // reading it after any rows would label a copy newer than its content, which nothing could catch.
  const revision = tankDataRevisionInDb(db, tankId)
  const streamed = streamsHistory(db, tankId, revision) ? evaluateStreamed(db, tankId, head, revision) : undefined
  return streamed ?? evaluateTank({ ...head, history: keptHistory(db, tankId, revision).history })
}

/**
 * The verdict and forecast from the tank's history streamed past once and held for its last
 * HISTORY_WINDOW_DAYS only (its count of changes read at `revision`, before its rows), or
 * undefined when the window cannot settle them (the engine says so: it never guesses); the caller
 * then evaluates the whole history.
 */
function evaluateStreamed(db: Db, tankId: string, head: StreamedInputHead, revision: number): TankEvaluation | undefined {
  const input = streamedInput(db, tankId, head, HISTORY_WINDOW_DAYS, revision)
  if (!input) return undefined
  try {
    return evaluateTank(input)
  }
  catch (error) {
    if (error instanceof BeyondWindow) return undefined
    throw error
  }
}

/** What is stored for a tank: the engine's verdict and the completion forecast made from the same input. */
export interface TankEvaluation {
  verdict: Verdict
  forecast: CycleForecast
}

/** The verdict and forecast for one engine input, its history prepared (here, or in a worker thread). */
export function evaluateTank(input: PreparedInput): TankEvaluation {
  const verdict = evaluatePrepared(input, CURRENT_RULE_OPTIONS)
  return { verdict, forecast: forecastPrepared(input, verdict) }
}

/**
 * The upsert of a tank's current verdict, prepared once: the row's values bound (Drizzle still
 * encodes each as its column's type: JSON, boolean), and on a tank that has one, every column
 * set to the value just offered (`excluded`).
 */
const upsertVerdict = preparedPerDb((db) => {
  const offered = (column: string) => sql.raw(`excluded.${column}`)
  return db.insert(tankVerdicts).values({
    tankId: sql.placeholder('tankId'),
    phase: sql.placeholder('phase'),
    verdict: sql.placeholder('verdict'),
    forecast: sql.placeholder('forecast'),
    ruleSetVersion: sql.placeholder('ruleSetVersion'),
    evaluatedAt: sql.placeholder('evaluatedAt'),
    stale: false,
  }).onConflictDoUpdate({
    target: tankVerdicts.tankId,
    set: {
      phase: offered(tankVerdicts.phase.name),
      verdict: offered(tankVerdicts.verdict.name),
      forecast: offered(tankVerdicts.forecast.name),
      ruleSetVersion: offered(tankVerdicts.ruleSetVersion.name),
      evaluatedAt: offered(tankVerdicts.evaluatedAt.name),
      stale: false,
    },
  }).prepare()
})

/** Stores an evaluation made as of `evaluatedAt` (here, or in a worker thread) as the tank's current one. */
export function storeVerdict(db: Db, tankId: string, { verdict, forecast }: TankEvaluation, evaluatedAt: string): void {
  upsertVerdict(db).run({
    tankId,
    phase: verdict.phase,
    verdict,
    forecast,
    ruleSetVersion: verdict.ruleSetVersion,
    evaluatedAt,
  })
}

/** The forecasts kept with the verdicts of a page of tanks, prepared once (the ids as one JSON array). */
const forecastsAmong = preparedPerDb(db => db.select({ tankId: tankVerdicts.tankId, forecast: tankVerdicts.forecast }).from(tankVerdicts)
  .where(inArray(tankVerdicts.tankId, sql`(select value from json_each(${sql.placeholder('ids')}))`)).prepare())

/** The forecast stored with each of these tanks' verdicts, by tank id (absent: no verdict stored yet). */
export function storedForecasts(db: Db, tankIds: readonly string[]): Map<string, CycleForecast | null> {
  if (tankIds.length === 0) return new Map()
  return new Map(forecastsAmong(db).all({ ids: JSON.stringify(tankIds) }).map(r => [r.tankId, r.forecast]))
}

/**
 * A stored verdict speaks for `now` when it was made at most `maxAgeMs` before it. One made
 * after `now` (a clock set back, a test's injected time) does not: it may count on time that
 * has not passed.
 */
export function verdictIsCurrent(evaluatedAt: string, now: Date, maxAgeMs: number): boolean {
  const age = now.getTime() - Date.parse(evaluatedAt)
  return Number.isFinite(age) && age >= 0 && age <= maxAgeMs
}

/** The version of the forecast stored with a verdict, read by SQLite so a freshness check parses no forecast here. */
const storedForecastVersion = sql<string | null>`json_extract(${tankVerdicts.forecast}, '$.forecastVersion')`

/** What says whether a stored verdict stands: null fields when the tank has none. */
export interface VerdictAge {
  evaluatedAt: string | null
  stale: boolean | null
  forecastVersion: string | null
}

/**
 * A stored verdict is made again when it is missing, marked stale by a threshold change, no
 * longer current at `now`, or stored without a forecast of the current forecast version (made
 * before forecasts were kept, or by older maths).
 */
export function verdictNeedsRemaking(age: VerdictAge, now: Date, maxAgeMs: number): boolean {
  return age.evaluatedAt === null || age.stale === true || age.forecastVersion !== FORECAST_VERSION || !verdictIsCurrent(age.evaluatedAt, now, maxAgeMs)
}

/**
 * The stored verdicts' freshness, prepared once: among the tanks of a page (ids as one JSON
 * array, however many) or over every tank not archived (the worker's round).
 */
const verdictAges = preparedPerDb((db) => {
  const fields = { id: tanks.id, evaluatedAt: tankVerdicts.evaluatedAt, stale: tankVerdicts.stale, forecastVersion: storedForecastVersion }
  const ages = () => db.select(fields).from(tanks).leftJoin(tankVerdicts, eq(tankVerdicts.tankId, tanks.id))
  return {
    among: ages().where(inArray(tanks.id, sql`(select value from json_each(${sql.placeholder('ids')}))`)).prepare(),
    unarchived: ages().where(isNull(tanks.archivedAt)).prepare(),
  }
})

/**
 * Tanks whose stored verdict is to be made again (`verdictNeedsRemaking`): among `tankIds` when
 * given (a page being read), otherwise every tank not archived (the worker's round).
 */
export function tanksWithStaleVerdicts(db: Db, now: Date, maxAgeMs: number, tankIds?: readonly string[]): string[] {
  if (tankIds !== undefined && tankIds.length === 0) return []
  const statements = verdictAges(db)
  const rows = tankIds === undefined ? statements.unarchived.all() : statements.among.all({ ids: JSON.stringify(tankIds) })
  return rows.filter(r => verdictNeedsRemaking(r, now, maxAgeMs)).map(r => r.id)
}

/**
 * One tank's stored verdict, prepared once, with its age in the same statement: the verdict as
 * its stored text (a reader keeps what a text was read into, `server/utils/verdict.ts`).
 * Undefined when the tank has none.
 */
const storedVerdictWithAge = preparedPerDb(db => db.select({
  phase: tankVerdicts.phase, verdictText: sql<string>`${tankVerdicts.verdict}`, ruleSetVersion: tankVerdicts.ruleSetVersion,
  evaluatedAt: tankVerdicts.evaluatedAt, stale: tankVerdicts.stale, forecastVersion: storedForecastVersion,
}).from(tankVerdicts).where(eq(tankVerdicts.tankId, sql.placeholder('tankId'))).prepare())

/** One tank's stored verdict row, its verdict as stored text, and whether it stands (`verdictNeedsRemaking`). */
export function storedVerdictRow(db: Db, tankId: string) {
  return storedVerdictWithAge(db).get({ tankId })
}
