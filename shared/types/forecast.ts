/** API response shapes for the completion forecast. */
import type { CycleForecast } from '../cycle/forecast/types'

export type { CycleForecast, ForecastRange, ForecastGap } from '../cycle/forecast/types'

/** GET /api/tanks/:id/forecast. */
export interface TankForecastView {
  tankId: string
  /** The moment the forecast is for (ISO). */
  computedAt: string
  forecast: CycleForecast
}
