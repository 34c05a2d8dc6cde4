import type { AttentionForecast } from '#shared/types/attention'
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

/** The staff board's line: when the verdict is likely to prove the cycle, said as a forecast, or why there is no date yet. */
export function completionWords(forecast: AttentionForecast): string {
  if (forecast.status === 'complete' && forecast.completion) return `Cycle proven complete ${rangeWords(forecast.completion)}`
  if (forecast.status === 'forecast' && forecast.completion) return `Cycle likely complete ${rangeWords(forecast.completion)} (a forecast)`
  return 'Completion forecast: not enough data yet'
}
