/** Public entry of the completion forecast. */
export { forecastCycle, forecastPrepared } from './forecast'
export { explainForecast, FORECAST_CAVEAT, forecastGapWords, forecastRangeWords, type DateWords } from './words'
export { FORECAST_VERSION } from './version'
export * from './types'
