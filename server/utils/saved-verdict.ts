import { citedRules } from './cited-rules'
import type { Verdict } from '#shared/cycle/types'
import type { ReadingSaved } from '#shared/types/readings'

const RANK = { danger: 0, caution: 1, info: 2 } as const

/** The part of a verdict a save answers with: the phase, danger and caution findings (danger first) with their rules, and the actions. */
export function verdictOnSave(verdict: Verdict | undefined): Pick<ReadingSaved, 'phase' | 'findings' | 'actions' | 'rules'> {
  if (!verdict) return { phase: null, findings: [], actions: [], rules: {} }
  const findings = verdict.findings.filter(f => f.severity !== 'info').sort((a, b) => RANK[a.severity] - RANK[b.severity])
  return { phase: verdict.phase, findings, actions: verdict.actions, rules: citedRules(findings.map(f => f.ruleId)) }
}
