import type { CycleForecast, ForecastRange } from '#shared/types/forecast'
import type { CycleMethod } from '#shared/vocabulary'
import { formatDate } from '~/utils/format'

/** "between Dec 18 and Dec 24, 2026" (the year once when both ends share it), or "on Dec 18, 2026". */
export function rangeWords(range: ForecastRange): string {
  const from = formatDate(range.from)
  const to = formatDate(range.to)
  if (from === to) return `on ${from}`
  const sameYear = new Date(range.from).getFullYear() === new Date(range.to).getFullYear()
  const short = new Date(range.from).toLocaleDateString(undefined, { day: 'numeric', month: 'short' })
  return `between ${sameYear ? short : from} and ${to}`
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
