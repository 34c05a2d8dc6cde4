import type { Verdict } from '#shared/cycle/types'
import type { ReadingSaved } from '#shared/types/readings'

const RANK = { danger: 0, caution: 1, info: 2 } as const

/** The part of a verdict a save answers with: the phase, danger and caution findings (danger first) and the actions. */
export function verdictOnSave(verdict: Verdict | undefined): Pick<ReadingSaved, 'phase' | 'findings' | 'actions'> {
  if (!verdict) return { phase: null, findings: [], actions: [] }
  const findings = verdict.findings.filter(f => f.severity !== 'info').sort((a, b) => RANK[a.severity] - RANK[b.severity])
  return { phase: verdict.phase, findings, actions: verdict.actions }
}
