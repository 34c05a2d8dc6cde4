/**
 * Runs the rule engine for one tank and stores the verdict, so lists and dashboards
 * read the phase without recomputing. Framework-free: the server, the seed and the
 * tests share it.
 */
import { asc, eq } from 'drizzle-orm'
import { evaluateCycle } from '../../shared/cycle/engine'
import type { CycleEvent, CycleEventKind, CycleInput, CycleReading, LivestockGroup, Thresholds, Verdict } from '../../shared/cycle/types'
import type { TidewrightDB } from './connection'
import { events, organisations, readings, tankVerdicts, tanks } from './schema'

const ENGINE_EVENT_KINDS = new Set<string>(['ammonia-dose', 'bacteria-dose', 'water-change', 'livestock-added', 'note'])
const LIVESTOCK = new Set<string>(['fish', 'invertebrates', 'soft-coral', 'lps-coral', 'sps-coral'])

const defined = <T>(value: T | null): T | undefined => value ?? undefined

/** The engine input for a tank as the database holds it now, or undefined if there is no such tank. */
export function cycleInputFor(db: TidewrightDB, tankId: string, now: Date): CycleInput | undefined {
  const tank = db.select().from(tanks).where(eq(tanks.id, tankId)).get()
  if (!tank) return undefined
  const org = db.select({ settings: organisations.settings }).from(organisations).where(eq(organisations.id, tank.organisationId)).get()
  const thresholds = (org?.settings?.thresholds ?? {}) as Partial<Thresholds>
  const readingRows = db.select().from(readings).where(eq(readings.tankId, tankId)).orderBy(asc(readings.takenAt), asc(readings.id)).all()
  const eventRows = db.select().from(events).where(eq(events.tankId, tankId)).orderBy(asc(events.at), asc(events.id)).all()
  // A correction replaces the entry it corrects; the engine sees only the current value.
  const corrected = new Set(readingRows.map(r => r.correctsId).filter(Boolean))
  const correctedEvents = new Set(eventRows.map(e => e.correctsId).filter(Boolean))
  return {
    tank: { volumeLitres: tank.volumeLitres + tank.sumpLitres, cycleMethod: tank.cycleMethod, startedAt: tank.cycleStartedAt ?? tank.createdAt },
    readings: readingRows.filter(r => !corrected.has(r.id)).map((r): CycleReading => ({
      id: r.id,
      takenAt: r.takenAt,
      // Two tests taken in the same minute: the one entered last is the latest.
      enteredAt: r.createdAt,
      ammoniaN: defined(r.ammoniaN),
      nitriteN: defined(r.nitriteN),
      nitrateN: defined(r.nitrateN),
      pH: defined(r.pH),
      temperatureC: defined(r.temperatureC),
      salinity: defined(r.salinity),
      alkalinityDkh: defined(r.alkalinityDkh),
      calciumMgL: defined(r.calciumMgL),
      magnesiumMgL: defined(r.magnesiumMgL),
      phosphateMgL: defined(r.phosphateMgL),
    })),
    events: eventRows.filter(e => ENGINE_EVENT_KINDS.has(e.kind) && !correctedEvents.has(e.id)).map((e): CycleEvent => ({
      id: e.id,
      at: e.at,
      enteredAt: e.createdAt,
      kind: e.kind as CycleEventKind,
      amount: defined(e.amount),
      group: e.group && LIVESTOCK.has(e.group) ? e.group as LivestockGroup : undefined,
    })),
    thresholds,
    now: now.toISOString(),
  }
}

/** Evaluates the tank's cycle now and stores the verdict; undefined if the tank does not exist. */
export function computeAndStoreVerdict(db: TidewrightDB, tankId: string, now = new Date()): Verdict | undefined {
  const input = cycleInputFor(db, tankId, now)
  if (!input) return undefined
  const verdict = evaluateCycle(input)
  const row = {
    tankId,
    phase: verdict.phase,
    verdict: verdict as unknown as Record<string, unknown>,
    ruleSetVersion: verdict.ruleSetVersion,
    evaluatedAt: input.now,
  }
  db.insert(tankVerdicts).values(row).onConflictDoUpdate({ target: tankVerdicts.tankId, set: row }).run()
  return verdict
}
