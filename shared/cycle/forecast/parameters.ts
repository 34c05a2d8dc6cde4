/**
 * The forecast's own tuning. These are properties of the fitting method, not of the
 * cycle: every limit about the cycle itself (what reads as zero, how long zero tests
 * must run, how long corals wait) comes from the rule engine's thresholds and is
 * applied by running the engine. Values were chosen with the back-test
 * (`npm run backtest`); change one and bump FORECAST_VERSION.
 */

/** Central probability of the interval the forecast gives: 80 % (a 1-in-5 miss is expected and said). */
export const INTERVAL_PROBABILITY = 0.8

/** No forecast from fewer ammonia or nitrite tests than this, whatever the phase. */
export const MIN_TESTS = 5

/** A falling curve is fitted only on at least this many tests since its peak ... */
export const MIN_FIT_POINTS = 4

/** ... spanning at least this many days. */
export const MIN_FIT_SPAN_DAYS = 3

/**
 * Scatter of the tests around the fitted line (standard deviation of natural-log
 * residuals) above which the curve is called erratic: about a factor of 1.8 either side.
 */
export const MAX_LOG_SCATTER = 0.6

/** A range wider than this many days says too little to be worth showing. */
export const MAX_RANGE_DAYS = 21

/** Nothing is forecast beyond this many days from the latest test. */
export const HORIZON_DAYS = 60

/**
 * Half-life, in days, of a test's weight in the fit: the bacteria keep growing, so the
 * curve bends downward over time and the latest tests say most about the next days.
 */
export const WEIGHT_HALF_LIFE_DAYS = 4

/** Days added either side of the range to cover a missed test day and the kit's colour steps. */
export const RANGE_SLACK_DAYS = 1

/**
 * A test taken within this many hours after an ammonia dose given while the tank read
 * zero is the check that the dose arrived, not a point on the falling curve: the fit
 * leaves it out (the trade checks "a few hours" after a proof dose).
 */
export const DOSE_CHECK_HOURS = 8

/** The late end's allowance for nitrite coming back after the first full proof doses is at most this many days. */
export const MAX_RELAPSE_DAYS = 10
