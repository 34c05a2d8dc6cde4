/**
 * What an experienced aquarist would decide about a tank, as data, and whether a verdict
 * agrees with it. The scenario catalogue states one call per simulated tank; the unit test
 * fails on any disagreement and `npm run scenarios` prints the agreement of every rule set.
 */

import type { CyclePhase, LivestockGroup, Severity, Verdict } from '../types'

/** Something the verdict must say: a finding by rule id, at a severity, with words in it. */
export interface ExpectedFinding {
  readonly rule: string
  /** Required severity; any when omitted. */
  readonly severity?: Severity
  /** Words the finding's message must contain (case-insensitive). */
  readonly words?: string
}

/** The aquarist's decision at the cut, as checks on a verdict. Omitted checks are not judged. */
export interface AquaristCall {
  /** Would the aquarist call the cycle complete now? */
  readonly complete?: boolean
  /** Phases the aquarist would accept. */
  readonly phases?: readonly CyclePhase[]
  /** Groups that may go in now: blocking them would hold back a tank that is ready. */
  readonly allowed?: readonly LivestockGroup[]
  /** Groups that must wait. */
  readonly blocked?: readonly LivestockGroup[]
  /** Findings the verdict must report. */
  readonly says?: readonly ExpectedFinding[]
  /** Rule ids the verdict must not report (a false alarm the aquarist would dismiss). */
  readonly neverSays?: readonly string[]
  /** Action kinds the verdict must propose (e.g. 'water-change', 'retest', 'clearance-test'). */
  readonly actions?: readonly string[]
  /** No water change the verdict proposes may be larger than this percent. */
  readonly waterChangeAtMostPercent?: number
}

/** Each way `verdict` differs from `call`, in plain words; empty when they agree. */
export function disagreements(verdict: Verdict, call: AquaristCall): string[] {
  const out: string[] = []
  const complete = verdict.completedOn !== null
  if (call.complete !== undefined && call.complete !== complete) out.push(call.complete ? 'not complete, aquarist says cycled' : 'complete, aquarist says not yet')
  if (call.phases && !call.phases.includes(verdict.phase)) out.push(`phase ${verdict.phase}, aquarist says ${call.phases.join(' or ')}`)
  for (const group of call.allowed ?? []) if (!verdict.readiness[group].allowed) out.push(`${group} blocked, aquarist allows`)
  for (const group of call.blocked ?? []) if (verdict.readiness[group].allowed) out.push(`${group} allowed, aquarist waits`)
  for (const want of call.says ?? []) {
    const hit = verdict.findings.some(f => f.ruleId === want.rule
      && (want.severity === undefined || f.severity === want.severity)
      && (want.words === undefined || f.message.toLowerCase().includes(want.words.toLowerCase())))
    if (!hit) out.push(`missing ${want.severity ?? 'finding'} ${want.rule}${want.words ? ` naming "${want.words}"` : ''}`)
  }
  for (const rule of call.neverSays ?? []) if (verdict.findings.some(f => f.ruleId === rule)) out.push(`says ${rule}, aquarist would not`)
  for (const kind of call.actions ?? []) if (!verdict.actions.some(a => a.kind === kind)) out.push(`no ${kind} action`)
  if (call.waterChangeAtMostPercent !== undefined) {
    const largest = Math.max(0, ...verdict.actions.map(a => a.waterChangePercent ?? 0))
    if (largest > call.waterChangeAtMostPercent) out.push(`water change of ${largest} %, aquarist changes at most ${call.waterChangeAtMostPercent} % at a time`)
  }
  return out
}
