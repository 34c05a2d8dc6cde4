/**
 * Which tank statuses a forecast is shown for, and the forecast a list shows. Framework-free.
 * The forecast itself is made with the verdict, from the same input at the same time
 * (`evaluateTankNow`), and stored beside it: the tank page, the lists and the weekly digest
 * all read that one.
 */
import type { CycleForecast } from '#shared/cycle/forecast'
import type { TankStatus } from '#shared/vocabulary'

/** Tank statuses in which a cycle forecast means something to the reader. */
export const FORECAST_STATUSES: ReadonlySet<TankStatus> = new Set<TankStatus>(['cycling', 'cycled'])

/**
 * The forecast a list shows beside a tank (the tank list, the attention board): the one stored
 * with the tank's verdict (made from the same input at the same time, `evaluateTankNow`),
 * so a list reads one row per tank and never the history; while the cycle is what the reader
 * waits for (`FORECAST_STATUSES`), null for any other status.
 */
export function listedForecast(tank: { status: TankStatus }, stored: CycleForecast | null | undefined): CycleForecast | null {
  if (!FORECAST_STATUSES.has(tank.status)) return null
  return stored ?? null
}
