/**
 * The forecast in plain words for clients and staff. Dates are formatted by the
 * caller (the reader's own date format); these sentences never call a forecast a
 * promise: the rule engine's verdict decides.
 */

import type { CycleForecast, DeclineFit, ForecastGap, ForecastRange } from './types'

/** Formats an ISO time as a day on the reader's clock, "Dec 18, 2026" (`formatDay` in shared/readings/reader-words). */
export type DateWords = (iso: string) => string

/**
 * A range of likely days: "between Dec 18 and Dec 24, 2026" (the year once when both ends
 * share it), or "on Dec 18, 2026" when both ends fall on one day of the reader's clock.
 */
export function forecastRangeWords(range: ForecastRange, date: DateWords): string {
  const from = date(range.from)
  const to = date(range.to)
  if (from === to) return `on ${from}`
  // `date` ends with ", <year>": drop it from the first end when both ends share it.
  const cut = from.lastIndexOf(', ')
  const sameYear = cut > 0 && from.slice(cut) === to.slice(to.lastIndexOf(', '))
  return `between ${sameYear ? from.slice(0, cut) : from} and ${to}`
}

const SERIES_WORDS: Record<DeclineFit['series'], string> = { ammonia: 'Ammonia', nitrite: 'Nitrite' }

/** Why there is no range yet, in one sentence. */
export function forecastGapWords(gap: ForecastGap): string {
  switch (gap) {
    case 'not-started': return 'Not enough data yet: the cycle has not started.'
    case 'before-nitrite': return 'Not enough data yet: the tank is still in the ammonia stage, and the date depends on how the nitrite stage goes.'
    case 'sparse': return 'Not enough data yet: a forecast needs a few more tests, about a day apart.'
    case 'stale': return 'Not enough data yet: there has been no test for several days. Test today to get a forecast.'
    case 'rising': return 'Not enough data yet: nitrite is still rising. A forecast starts once it has been falling for a few tests.'
    case 'not-falling': return 'Not enough data yet: the curve is flat, not falling, so it gives no date. Check the stall advice in the verdict.'
    case 'erratic': return 'Not enough data yet: the tests jump around too much to read a trend from them.'
    case 'too-far': return 'Not enough data yet: at the pace so far the end is too far off or too uncertain to give a useful range.'
  }
}

function halvingWords(days: number): string {
  if (days < 1.5) return 'about every day'
  return `about every ${Math.round(days)} days`
}

function fitWords(fit: DeclineFit, date: DateWords): string {
  return `${SERIES_WORDS[fit.series]} has halved ${halvingWords(fit.halvingDays)} since ${date(fit.since)} (${fit.tests} tests); at that pace it reads zero on the kit between ${date(fit.readsZero.from)} and ${date(fit.readsZero.to)}.`
}

/** Said wherever a forecast is shown: the verdict, not the forecast, decides. */
export const FORECAST_CAVEAT = 'A forecast, not a promise: livestock goes in only when the verdict says the cycle is complete.'

/** What the forecast rests on, in plain sentences; show FORECAST_CAVEAT beside it. */
export function explainForecast(forecast: CycleForecast, date: DateWords): string {
  if (forecast.status === 'complete') return `The verdict proved the cycle complete on ${date(forecast.completion!.from)}.`
  if (forecast.status === 'not-enough-data') return forecastGapWords(forecast.gap ?? 'sparse')
  const parts = forecast.basis.fits.map(f => fitWords(f, date))
  if (forecast.basis.readingZero) parts.push('Ammonia and nitrite already read zero; what is left is the run of zero tests the verdict needs as proof.')
  if (forecast.basis.relapseDays > 0) parts.push(`The later date leaves about ${forecast.basis.relapseDays} days for nitrite to come back once when the full proof doses start, as it often does.`)
  parts.push(`It assumes a test about every ${forecast.basis.testEveryHours} hours from now on, and no water change meanwhile; ${Math.round(forecast.probability * 100)} out of 100 such ranges should hold the real date.`)
  return parts.join(' ')
}
