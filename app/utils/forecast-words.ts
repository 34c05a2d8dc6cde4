import { forecastRangeWords, type DateWords } from '#shared/cycle/forecast/words'
import type { AttentionForecast } from '#shared/types/attention'
import type { CycleForecast, ForecastRange } from '#shared/types/forecast'
import type { CycleMethod } from '#shared/vocabulary'
import { formatDate } from '~/utils/reader-clock'

/** A forecast's day on the reader's clock (the company's time zone, utils/reader-clock), "Dec 18, 2026". */
export const readerDay: DateWords = iso => formatDate(iso)

/** "between Dec 18 and Dec 24, 2026" (the year once when both ends share it), or "on Dec 18, 2026", on the reader's clock. */
export function rangeWords(range: ForecastRange): string {
  return forecastRangeWords(range, readerDay)
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
