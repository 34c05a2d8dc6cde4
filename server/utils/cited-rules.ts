import { ruleInfo } from '#shared/cycle/registry'
import type { Verdict } from '#shared/cycle/types'
import { blockerRule } from '#shared/readings/readiness-words'
import type { CitedRules } from '#shared/types/readings'

/**
 * The words of each named rule (id, description, source), so a page shows staff a finding's
 * rule without loading the registry; an id this rule set does not have is left out.
 */
export function citedRules(ruleIds: Iterable<string>): CitedRules {
  const rules: CitedRules = {}
  for (const id of ruleIds) {
    const info = ruleInfo(id)
    if (info) rules[id] = { id: info.id, description: info.description, source: info.source }
  }
  return rules
}

/**
 * The rules a verdict's findings and livestock blockers name. A blocker carries no rule id,
 * so its rule is the one whose form it is written in, as the page reads it (`blockerRule`).
 */
export function rulesCitedBy(verdict: Pick<Verdict, 'findings' | 'readiness'>): CitedRules {
  const blockers = Object.values(verdict.readiness).flatMap(group => group.blockers)
  const ids = new Set([...verdict.findings.map(f => f.ruleId), ...blockers.map(blockerRule).filter(id => id !== null)])
  return citedRules(ids)
}
