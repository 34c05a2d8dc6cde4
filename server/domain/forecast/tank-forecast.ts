/**
 * The completion forecast for one tank, computed from the same input the rule engine
 * gets (current tests and events, corrections applied, the company's thresholds).
 * Framework-free: routes, the tank list and the weekly digest share it.
 */
import { forecastCycle } from '../../../shared/cycle/forecast'
import type { CycleForecast } from '../../../shared/cycle/forecast'
import type { TidewrightDB } from '../../db/connection'
import { cycleInputFor } from '../../db/verdicts'
import type { TankStatus } from '../../../shared/vocabulary'

/** Tank statuses in which a cycle forecast means something to the reader. */
export const FORECAST_STATUSES: ReadonlySet<TankStatus> = new Set<TankStatus>(['cycling', 'cycled'])

/** The forecast for `tankId` at `now`, or undefined when there is no such tank. */
export function forecastTank(db: TidewrightDB, tankId: string, now: Date): CycleForecast | undefined {
  const input = cycleInputFor(db, tankId, now)
  return input ? forecastCycle(input) : undefined
}
