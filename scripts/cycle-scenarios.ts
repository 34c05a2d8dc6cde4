/**
 * Prints, per simulated scenario, the verdict under every rule set Tidewright knows (1.0.0
 * frozen in shared/cycle/v1, each 2.x kept selectable) and whether it agrees with what an
 * experienced aquarist would decide, then the totals. `npm run scenarios`; `-- --why` also
 * prints each disagreement.
 */
import { disagreements } from '../shared/cycle/simulate/agreement'
import { SCENARIOS, scenarioInput } from '../shared/cycle/simulate/scenarios'
import { RULE_SETS } from '../shared/cycle/versions'
import type { Verdict } from '../shared/cycle/types'

const DAY = 86_400_000
const why = process.argv.includes('--why')
const versions = Object.keys(RULE_SETS)
const short = (version: string) => version.replace('tidewright-cycle-', '')

function summary(v: Verdict, start: string): string {
  const done = v.completedOn === null ? '' : ` d${Math.floor((Date.parse(v.completedOn) - Date.parse(start)) / DAY)}`
  const allowed = Object.entries(v.readiness).filter(([, r]) => r.allowed).map(([g]) => g.replace('-coral', ''))
  const dangers = v.findings.filter(f => f.severity === 'danger').length
  return `${v.phase}${done}; in: ${allowed.join(',') || '-'}${dangers ? `; ${dangers} danger` : ''}`
}

const agreed = Object.fromEntries(versions.map(v => [v, 0]))
console.log(`| scenario | item | ${versions.map(v => short(v)).join(' | ')} |`)
console.log(`|---|---|${versions.map(() => '---').join('|')}|`)
for (const scenario of SCENARIOS) {
  const input = scenarioInput(scenario)
  const cells = versions.map((version) => {
    const verdict = RULE_SETS[version]!(input)
    const wrong = disagreements(verdict, scenario.expect)
    if (wrong.length === 0) agreed[version]! += 1
    if (why && wrong.length > 0) console.error(`  ${scenario.id} under ${short(version)}: ${wrong.join('; ')}`)
    return `${wrong.length === 0 ? 'agrees' : 'DISAGREES'}: ${summary(verdict, scenario.plan.start)}`
  })
  console.log(`| ${scenario.id} | ${scenario.item} | ${cells.join(' | ')} |`)
}
for (const scenario of SCENARIOS.filter(s => s.open)) console.log(`\nOpen: ${scenario.id}: ${scenario.open}`)
console.log(`\nAgreement with the aquarist (${SCENARIOS.length} scenarios): ${versions.map(v => `${short(v)} ${agreed[v]}/${SCENARIOS.length}`).join(', ')}`)
