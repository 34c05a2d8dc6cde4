import type { CycleForecast, ForecastRange } from '#shared/types/forecast'
import { formatDate } from '~/utils/format'

/** "between 18 Dec 2026 and 24 Dec 2026", or "on 18 Dec 2026" when both ends fall on one day. */
export function rangeWords(range: ForecastRange): string {
  const from = formatDate(range.from)
  const to = formatDate(range.to)
  return from === to ? `on ${from}` : `between ${from} and ${to}`
}

/**
 * The one line a client looks for: when fish may likely go in. A fish-in tank already
 * holds its fish, so it speaks of more fish.
 */
export function fishHeadline(forecast: CycleForecast, cycleMethod: 'fishless' | 'fish-in'): string | null {
  const fish = forecast.groups.fish
  if (forecast.status !== 'forecast' || !fish) return null
  return `Likely ready for ${cycleMethod === 'fish-in' ? 'more fish' : 'fish'} ${rangeWords(fish)}`
}

/** Said wherever a forecast is shown: the verdict, not the forecast, decides. */
export const FORECAST_CAVEAT = 'A forecast, not a promise: livestock goes in only when the verdict says the cycle is complete.'
