/** Public entry of the completion forecast. */
export { forecastCycle } from './forecast'
export { explainForecast, FORECAST_CAVEAT, forecastGapWords } from './words'
export { FORECAST_VERSION } from './version'
export * from './types'
