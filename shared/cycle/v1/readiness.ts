/**
 * Readiness per livestock group: allowed now, the earliest time the timeline
 * allows, and the plain-word blockers, from the readiness rules.
 */

import { READINESS_RULES, earliestFor } from './rules/readiness'
import { toIso } from './time'
import type { Finding, GroupReadiness, LivestockGroup } from './types'
import type { ReadinessContext, RuleContext } from './context'

function decide(ctx: ReadinessContext, decided: Partial<Record<LivestockGroup, boolean>>, group: LivestockGroup): GroupReadiness {
  const blockers: string[] = []
  for (const rule of READINESS_RULES) {
    if (rule.groups.includes(group)) blockers.push(...rule.block(ctx, group, blockers))
  }
  const earliest = earliestFor(ctx, group)
  decided[group] = blockers.length === 0
  return { allowed: blockers.length === 0, earliest: earliest === null ? null : toIso(earliest), blockers }
}

/** Decides every group, fish first, so the coral groups can rely on the fish decision. */
export function assessReadiness(ctx: RuleContext, findings: readonly Finding[]): Record<LivestockGroup, GroupReadiness> {
  const decided: Partial<Record<LivestockGroup, boolean>> = {}
  const rctx: ReadinessContext = { ...ctx, findings, decided }
  // Object literal members are evaluated in order: fish is decided before any coral group asks.
  return {
    'fish': decide(rctx, decided, 'fish'),
    'invertebrates': decide(rctx, decided, 'invertebrates'),
    'soft-coral': decide(rctx, decided, 'soft-coral'),
    'lps-coral': decide(rctx, decided, 'lps-coral'),
    'sps-coral': decide(rctx, decided, 'sps-coral'),
  }
}
