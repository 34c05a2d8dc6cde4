/**
 * Ammonia safety with animals in: total ammonia against the trade's action level,
 * and the un-ionized (free) share against the US EPA saltwater criteria.
 */

import { freeAmmonia, PH_RANGE, SALINITY_RANGE, SEAWATER_TEMPERATURE_RANGE_C, FRESHWATER_TEMPERATURE_RANGE_C } from '../../chemistry/ammonia'
import { animalsInAt, type RuleContext } from '../context'
import { conditionsAt, readingsFrom } from '../reads'
import { DAY_MS, formatWhen, HOUR_MS, toIso } from '../time'
import { formatNumber, mgN, mgNWithIon } from '../words'
import type { TimedReading } from '../history'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'
import { waterChangeActions } from './water-change'

const EPA_1989 = 'US EPA (1989), Ambient Water Quality Criteria for Ammonia (Saltwater) - 1989, EPA 440/5-88-004; NH3 share from Emerson et al. (1975) with the seawater correction of Khoo et al. (1977)'

/** A reef tank is near salinity 35; when no salinity was tested, that is the best stand-in for the ionic-strength term. */
const ASSUMED_SALINITY = 35

/** The latest ammonia test above zero taken with animals in, or null. */
function ammoniaWithAnimals(ctx: RuleContext): TimedReading | null {
  const test = ctx.latest.ammoniaN
  if (test === undefined || (test.ammoniaN ?? 0) <= ctx.thresholds.ammoniaZeroN) return null
  return animalsInAt(ctx, test.t) ? test : null
}

function inside(value: number, range: readonly [number, number]): boolean {
  return value >= range[0] && value <= range[1]
}

interface FreeAmmonia {
  readonly valueN: number
  readonly fraction: number
  readonly words: string
  readonly readings: readonly TimedReading[]
}

/** Free ammonia for the test, or null when pH or temperature is unknown or outside the formula's range. */
export function freeAmmoniaFor(ctx: RuleContext, test: TimedReading): FreeAmmonia | null {
  const c = conditionsAt(ctx.history, test, ctx.thresholds.conditionsMaxAgeHours)
  if (c.pH === undefined || c.temperatureC === undefined) return null
  const salinity = c.salinity?.value ?? ASSUMED_SALINITY
  const temperatureRange = salinity > 0 ? SEAWATER_TEMPERATURE_RANGE_C : FRESHWATER_TEMPERATURE_RANGE_C
  if (!inside(c.pH.value, PH_RANGE) || !inside(c.temperatureC.value, temperatureRange) || !inside(salinity, SALINITY_RANGE)) return null
  const conditions = { pH: c.pH.value, temperatureC: c.temperatureC.value, salinity }
  const total = test.ammoniaN ?? 0
  const valueN = freeAmmonia(total, conditions)
  const salinityWords = c.salinity ? `salinity ${formatNumber(salinity)}` : `salinity assumed ${ASSUMED_SALINITY}`
  return {
    valueN,
    fraction: total > 0 ? valueN / total : 0,
    words: `pH ${formatNumber(conditions.pH)}, ${formatNumber(conditions.temperatureC)} C, ${salinityWords}`,
    readings: [test, c.pH.from, c.temperatureC.from, ...(c.salinity ? [c.salinity.from] : [])],
  }
}

function actionThreshold(ctx: RuleContext): RuleResult {
  const test = ammoniaWithAnimals(ctx)
  const limit = ctx.thresholds.ammoniaActionN
  const value = test?.ammoniaN ?? 0
  if (test === null || value <= limit) return NOTHING
  return report(
    'danger',
    `Total ammonia is ${mgN(value)} (test of ${formatWhen(test.t)}), above the ${mgNWithIon(limit, 'NH3')} limit for a tank with animals in. Change water now and feed lightly.`,
    [test],
    waterChangeActions(ctx, 'total ammonia', value, limit),
  )
}

function freeAcute(ctx: RuleContext): RuleResult {
  const test = ammoniaWithAnimals(ctx)
  const free = test && freeAmmoniaFor(ctx, test)
  const limit = ctx.thresholds.freeAmmoniaAcuteN
  if (!test || !free || free.valueN <= limit || free.fraction <= 0) return NOTHING
  // Dilution lowers total and free ammonia alike, so the total that keeps free ammonia under the limit is limit / fraction.
  const totalLimit = limit / free.fraction
  return report(
    'danger',
    `Free (toxic) ammonia is ${mgN(free.valueN)} at ${free.words}, above the US EPA short-term saltwater limit of ${mgN(limit)}. Animals can be harmed within hours: change water now.`,
    free.readings,
    waterChangeActions(ctx, 'total ammonia', test.ammoniaN ?? 0, totalLimit),
  )
}

function freeChronic(ctx: RuleContext): RuleResult {
  const test = ammoniaWithAnimals(ctx)
  const free = test && freeAmmoniaFor(ctx, test)
  const th = ctx.thresholds
  if (!test || !free || free.valueN <= th.freeAmmoniaChronicN || free.valueN > th.freeAmmoniaAcuteN) return NOTHING
  return report(
    'caution',
    `Free (toxic) ammonia is ${mgN(free.valueN)} at ${free.words}, above the US EPA long-term saltwater limit of ${mgN(th.freeAmmoniaChronicN)}. Feed lightly, keep pH from rising, and test again within a day.`,
    free.readings,
    [{ kind: 'retest', message: 'Test ammonia, pH and temperature again within a day.', dueBy: toIso(ctx.nowMs + th.retestHours * HOUR_MS) }],
  )
}

/** Free ammonia averaged over the EPA averaging period ending at the latest test, or null without enough tests. */
function chronicAverage(ctx: RuleContext, latest: TimedReading): { meanN: number, tests: TimedReading[] } | null {
  const th = ctx.thresholds
  const from = latest.t - th.chronicAveragingDays * DAY_MS
  const values: number[] = []
  const tests: TimedReading[] = []
  for (const r of readingsFrom(ctx.history, from, latest.t)) {
    if (r.ammoniaN === undefined || !animalsInAt(ctx, r.t)) continue
    const free = r.ammoniaN <= th.ammoniaZeroN ? { valueN: 0 } : freeAmmoniaFor(ctx, r)
    if (free === null) continue
    values.push(free.valueN)
    tests.push(r)
  }
  const first = tests[0]
  // The period must be covered by tests, not inferred from one or two days.
  if (first === undefined || tests.length < 3 || latest.t - first.t < (th.chronicAveragingDays - 1) * DAY_MS) return null
  return { meanN: values.reduce((a, b) => a + b, 0) / values.length, tests }
}

function freeChronicAverage(ctx: RuleContext): RuleResult {
  const test = ammoniaWithAnimals(ctx)
  if (test === null) return NOTHING
  const th = ctx.thresholds
  const average = chronicAverage(ctx, test)
  if (average === null || average.meanN <= th.freeAmmoniaChronicN) return NOTHING
  const free = freeAmmoniaFor(ctx, test)
  const totalLimit = free && free.fraction > 0 ? th.freeAmmoniaChronicN / free.fraction : th.ammoniaActionN
  return report(
    'danger',
    `Free (toxic) ammonia has averaged ${mgN(average.meanN)} over the ${average.tests.length} tests of the last ${th.chronicAveragingDays} days, above the US EPA long-term saltwater limit of ${mgN(th.freeAmmoniaChronicN)} held over its ${th.chronicAveragingDays}-day averaging period. The animals have been exposed for days: change water now, feed very lightly, and test every day.`,
    average.tests,
    waterChangeActions(ctx, 'total ammonia', test.ammoniaN ?? 0, totalLimit),
  )
}

function freeUnknown(ctx: RuleContext): RuleResult {
  const test = ammoniaWithAnimals(ctx)
  if (test === null || freeAmmoniaFor(ctx, test) !== null) return NOTHING
  return report(
    'info',
    `Ammonia is ${mgN(test.ammoniaN ?? 0)} with animals in, but without pH and temperature from the same day (or outside the range the formula covers) the toxic share cannot be worked out. Record pH and temperature with every ammonia test.`,
    [test],
  )
}

/** Ammonia safety rules. */
export const AMMONIA_RULES: readonly CycleRule[] = [
  {
    id: 'ammonia.action-threshold',
    description: 'With animals in, total ammonia above 0.5 ppm as NH3 (expressed as N) calls for a water change now.',
    source: COMMON_PRACTICE,
    severities: ['danger'],
    evaluate: actionThreshold,
  },
  {
    id: 'ammonia.free-acute',
    description: 'With animals in, un-ionized ammonia above the EPA saltwater acute criterion, 0.233 mg/L NH3 (0.1916 as N).',
    source: EPA_1989,
    severities: ['danger'],
    evaluate: freeAcute,
  },
  {
    id: 'ammonia.free-chronic',
    description: 'With animals in, un-ionized ammonia above the EPA saltwater chronic criterion, 0.035 mg/L NH3 (0.0288 as N).',
    source: EPA_1989,
    severities: ['caution'],
    evaluate: freeChronic,
  },
  {
    id: 'ammonia.free-chronic-average',
    description: 'With animals in, un-ionized ammonia averaged over the EPA averaging period (4 days) above the chronic criterion, 0.035 mg/L NH3.',
    source: `${EPA_1989}; the CCC is a 4-day average`,
    severities: ['danger'],
    evaluate: freeChronicAverage,
  },
  {
    id: 'ammonia.free-unknown',
    description: 'With animals in and ammonia above zero, pH and temperature are needed to work out the toxic share.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: freeUnknown,
  },
]
