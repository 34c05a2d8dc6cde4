/**
 * Prints each simulated scenario's verdict under rule set 1.0.0 and 2.0.0 side by side:
 * phase, completion day, dangers and cautions, and which groups may go in.
 * `npx tsx scripts/cycle-scenarios.ts`
 */
import { SCENARIOS, scenarioInput } from '../shared/cycle/simulate/scenarios'
import { RULE_SETS } from '../shared/cycle/versions'
import type { Verdict } from '../shared/cycle/types'

const DAY = 86_400_000

function describe(v: Verdict, start: string): string {
  const done = v.completedOn === null ? '-' : `day ${Math.floor((Date.parse(v.completedOn) - Date.parse(start)) / DAY)}`
  const flags = v.findings.filter(f => f.severity !== 'info').map(f => `${f.severity === 'danger' ? 'D' : 'C'}:${f.ruleId}`)
  const allowed = Object.entries(v.readiness).filter(([, r]) => r.allowed).map(([g]) => g)
  return `${v.phase} (complete ${done}); allowed: ${allowed.join(', ') || 'none'}; ${flags.join(' ') || 'no cautions'}`
}

for (const scenario of SCENARIOS) {
  const input = scenarioInput(scenario)
  console.log(`\n${scenario.id} (day ${scenario.at.day}): ${scenario.aquarist}`)
  for (const [version, evaluate] of Object.entries(RULE_SETS)) console.log(`  ${version.replace('tidewright-cycle-', '')}: ${describe(evaluate(input), scenario.plan.start)}`)
}
