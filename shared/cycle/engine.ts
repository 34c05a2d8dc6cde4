/**
 * The cycle rule engine: one pure function from a tank's tests and events to a
 * verdict. No clock, no randomness, no I/O: `now` is part of the input, so the
 * server and the browser reach the same verdict and a signed one can be re-run.
 */

import { mergeActions } from './actions'
import { traceCourse, type Course } from './course'
import { compareReadings, historyAsOf, prepareInput, type History, type PreparedInput } from './history'
import { decidePhase, firstSourceTime } from './phase'
import { assessReadiness } from './readiness'
import { CURRENT_RULE_OPTIONS, type RuleOptions } from './options'
import { FINDING_RULES } from './registry'
import { latestValues } from './snapshot'
import { resolveThresholds } from './thresholds'
import { requireTime, toIso } from './time'
import { assertWindowFits } from './window'
import type { RuleContext } from './context'
import type { CycleAction, CycleInput, CycleMethod, Finding, Severity, Thresholds, Verdict } from './types'

const SEVERITY_RANK: Record<Severity, number> = { danger: 0, caution: 1, info: 2 }

function compareStrings(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0
}

function compareFindings(a: Finding, b: Finding): number {
  return SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity]
    || compareStrings(a.ruleId, b.ruleId)
    || compareStrings(a.message, b.message)
    || compareStrings(a.readingIds.join('\u0000'), b.readingIds.join('\u0000'))
}

/** The course as of `nowMs`: traced over the history, or the one a window folded for this very evaluation. */
function courseOf(history: History, thresholds: Thresholds, method: CycleMethod, startedMs: number, nowMs: number, options: RuleOptions): Course {
  if (!history.window) return traceCourse(history, thresholds, method, startedMs, nowMs, options)
  assertWindowFits(history.window, { thresholds, method, startedMs, options }, nowMs)
  return history.window.course
}

function buildContext(input: PreparedInput, options: RuleOptions): RuleContext {
  const nowMs = requireTime('now', input.now)
  const startedMs = requireTime('tank.startedAt', input.tank.startedAt)
  const thresholds = resolveThresholds(input.thresholds)
  const prepared = input.history
  const history = historyAsOf(prepared, nowMs)
  const course = courseOf(history, thresholds, input.tank.cycleMethod, startedMs, nowMs, options)
  // Nothing after `now` was cut: the latest values of the whole prepared history are the ones.
  const latest = history.readings === prepared.readings ? prepared.latest : latestValues(history.readings)
  const sourceT = firstSourceTime(history, input.tank, startedMs, thresholds, nowMs)
  const phase = decidePhase({ history, course, latest, thresholds, sourceT })
  const livestock = history.events.filter(e => e.event.kind === 'livestock-added')
  return { tank: input.tank, startedMs, nowMs, thresholds, options, history, course, phase, latest, sourceT, livestock }
}

function runRules(ctx: RuleContext): { findings: Finding[], actions: CycleAction[] } {
  const findings: Finding[] = []
  const actions: CycleAction[] = []
  for (const rule of FINDING_RULES) {
    const result = rule.evaluate(ctx)
    for (const hit of result.hits) {
      // The same test can back a finding twice (e.g. pH and temperature from one test); list it once, oldest first.
      const ids = [...new Set(hit.readings.slice().sort(compareReadings).map(r => r.id))]
      findings.push({ ruleId: rule.id, severity: hit.severity, message: hit.message, readingIds: ids })
    }
    actions.push(...result.actions)
  }
  return { findings: findings.sort(compareFindings), actions: mergeActions(actions) }
}

/**
 * Evaluates a tank's nitrogen cycle: phase, completion, findings with reasons,
 * readiness per livestock group and next actions. Throws a RangeError when `now`
 * or `tank.startedAt` is not an ISO time or a threshold is not a finite number >= 0.
 * `options` selects an earlier 2.x version's behaviour (see `versions.ts`); the default is current.
 */
export function evaluateCycle(input: CycleInput, options: RuleOptions = CURRENT_RULE_OPTIONS): Verdict {
  return evaluatePrepared(prepareInput(input), options)
}

/**
 * `evaluateCycle` for an input whose history was prepared already: a tank's history kept between
 * its evaluations (a new test placed into it), or read from the database a row at a time. The
 * verdict is the one `evaluateCycle` gives for the readings and events it was prepared from.
 */
export function evaluatePrepared(input: PreparedInput, options: RuleOptions = CURRENT_RULE_OPTIONS): Verdict {
  const ctx = buildContext(input, options)
  const { findings, actions } = runRules(ctx)
  return {
    phase: ctx.phase,
    completedOn: ctx.course.completion ? toIso(ctx.course.completion.reading.t) : null,
    findings,
    readiness: assessReadiness(ctx, findings),
    actions,
    ruleSetVersion: options.version,
  }
}
