/**
 * The completion forecast for one tank, computed from the same input the rule engine
 * gets (current tests and events, corrections applied, the company's thresholds), and which
 * statuses a list shows one for. Framework-free. The tank page and the lists read the forecast
 * stored with the verdict; the weekly digest computes it here.
 */
import type { CycleForecast } from '#shared/cycle/forecast'
import type { Db } from '#server/db/connection'
import { evaluateTankNow } from '#server/db/verdicts'
import type { TankStatus } from '#shared/vocabulary'

/** Tank statuses in which a cycle forecast means something to the reader. */
export const FORECAST_STATUSES: ReadonlySet<TankStatus> = new Set<TankStatus>(['cycling', 'cycled'])

/** The forecast for `tankId` at `now` (from the tank's kept history, as the verdict is made), or undefined when there is no such tank. */
export function forecastTank(db: Db, tankId: string, now: Date): CycleForecast | undefined {
  return evaluateTankNow(db, tankId, now)?.forecast
}

/**
 * The forecast a list shows beside a tank (the tank list, the attention board): the one stored
 * with the tank's verdict (made from the same input at the same time, `computeAndStoreVerdict`),
 * so a list reads one row per tank and never the history; while the cycle is what the reader
 * waits for (`FORECAST_STATUSES`), null for any other status.
 */
export function listedForecast(tank: { status: TankStatus }, stored: CycleForecast | null | undefined): CycleForecast | null {
  if (!FORECAST_STATUSES.has(tank.status)) return null
  return stored ?? null
}
