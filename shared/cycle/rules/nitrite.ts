/**
 * Nitrite with animals in. Chloride in sea water protects marine fish from much
 * of nitrite's harm, so a high nitrite is a caution; past the hard limit it is a danger.
 */

import { animalsInAt, type RuleContext } from '../context'
import { formatWhen } from '../time'
import { mgN, mgNWithIon } from '../words'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'
import { waterChangeActions } from './water-change'

function highWithAnimals(ctx: RuleContext): RuleResult {
  const test = ctx.latest.nitriteN
  const limit = ctx.thresholds.nitriteHighWithAnimalsN
  const value = test?.nitriteN ?? 0
  if (test === undefined || value <= limit || !animalsInAt(ctx, test.t)) return NOTHING
  // Kits top out at the hard limit (5 ppm as NO2): from rule set 2.0.1 a reading at it is a danger too.
  const hard = ctx.thresholds.nitriteDangerWithAnimalsN
  const danger = ctx.options.nitriteDangerAtLimit ? value >= hard : value > hard
  return report(
    danger ? 'danger' : 'caution',
    `Nitrite is ${mgNWithIon(value, 'NO2')} on the test of ${formatWhen(test.t)}, with animals in: above ${mgN(limit)}. Marine fish cope with more nitrite than freshwater fish, but not without limit: change some water and watch the animals for fast breathing.`,
    [test],
    waterChangeActions(ctx, 'nitrite', value, limit),
  )
}

/** Nitrite rules. */
export const NITRITE_RULES: readonly CycleRule[] = [
  {
    id: 'nitrite.high-with-animals',
    description: 'With animals in, nitrite above the set level is a caution, at or above the hard limit (5 ppm as NO2, the top step of common kits) a danger. The levels are trade practice; that marine fish tolerate far more nitrite than freshwater fish is from Tomasso & Grosell (2005), Environ. Sci. Technol. 39: 98-102.',
    source: COMMON_PRACTICE,
    severities: ['danger', 'caution'],
    evaluate: highWithAnimals,
  },
]
