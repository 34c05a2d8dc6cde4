import type { CycleForecast, ForecastRange } from '#shared/types/forecast'
import type { CycleMethod } from '#shared/vocabulary'
import { formatDate, formatShortDayMs } from '~/utils/reader-clock'

/** "between Dec 18 and Dec 24, 2026" (the year once when both ends share it), or "on Dec 18, 2026". */
export function rangeWords(range: ForecastRange): string {
  const from = formatDate(range.from)
  const to = formatDate(range.to)
  if (from === to) return `on ${from}`
  // Both ends are written on the same clock, so their last four characters are their years there.
  const sameYear = from.slice(-4) === to.slice(-4)
  return `between ${sameYear ? formatShortDayMs(Date.parse(range.from)) : from} and ${to}`
}

/**
 * The one line a client looks for: when fish may likely go in. A fish-in tank already
 * holds its fish, so it speaks of more fish.
 */
export function fishHeadline(forecast: CycleForecast, cycleMethod: CycleMethod): string | null {
  const fish = forecast.groups.fish
  if (forecast.status !== 'forecast' || !fish) return null
  return `Likely ready for ${cycleMethod === 'fish-in' ? 'more fish' : 'fish'} ${rangeWords(fish)}`
}
