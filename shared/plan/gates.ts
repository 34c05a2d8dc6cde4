/**
 * Commissioning gates: what a stage must record before it may pass or close. Pure, so the
 * stage form can say it before sending and the server enforces the same rule on every
 * PATCH of a stage.
 */
import { elapsedHours } from './progress'

/** A leak test stands at least this long before it can pass (common practice, no published source: 24-48 h). */
export const LEAK_TEST_MIN_HOURS = 24
/** Clocks on phones and servers differ a little; a time this far ahead is still "now". */
const CLOCK_SLACK_MS = 5 * 60_000

export interface FieldIssue { field: string, message: string }

export interface GateContext {
  now: Date
  /** Footprint load over the occupancy's design live load, or null when it cannot be worked out. */
  surveyLoadRatio: number | null
}

const text = (value: unknown) => (typeof value === 'string' ? value.trim() : '')

/** Leak test: times in order and not in the future; a pass needs the minimum duration; closing needs a pass. */
export function leakTestIssues(data: Record<string, unknown>, closing: boolean, now: Date): FieldIssue[] {
  const issues: FieldIssue[] = []
  const startedAt = text(data.startedAt) || null
  const endedAt = text(data.endedAt) || null
  for (const [field, value, label] of [['startedAt', startedAt, 'The fill time'], ['endedAt', endedAt, 'The check time']] as const) {
    if (value && Date.parse(value) > now.getTime() + CLOCK_SLACK_MS) issues.push({ field: `data.${field}`, message: `${label} cannot be in the future.` })
  }
  if (startedAt && endedAt && Date.parse(endedAt) < Date.parse(startedAt)) {
    issues.push({ field: 'data.endedAt', message: 'The check comes after the fill: enter a later time.' })
  }
  const passing = data.result === 'pass'
  if (passing || closing) {
    if (!startedAt) issues.push({ field: 'data.startedAt', message: 'Enter when the tank was filled.' })
    if (!endedAt) issues.push({ field: 'data.endedAt', message: 'Enter when the seams were checked.' })
    const hours = elapsedHours(startedAt, endedAt)
    if (hours !== null && hours < LEAK_TEST_MIN_HOURS) {
      issues.push({ field: 'data.endedAt', message: `A leak test stands at least ${LEAK_TEST_MIN_HOURS} h before it can pass; this one stood ${Math.floor(hours * 10) / 10} h.` })
    }
  }
  if (closing && !passing) issues.push({ field: 'data.result', message: 'The stage is done only once the leak test has passed.' })
  return issues
}

/** Site survey over the design load: closing needs the structural check recorded, and by whom. */
export function siteSurveyIssues(data: Record<string, unknown>, closing: boolean, loadRatio: number | null): FieldIssue[] {
  if (!closing || loadRatio === null || loadRatio <= 1) return []
  if (data.structuralCheckDone === true && text(data.structuralCheckBy)) return []
  return [{
    field: 'data.structuralCheckBy',
    message: `The footprint load is ${Math.round(loadRatio * 100)} % of the design live load: record that the floor was checked structurally, and by whom, before closing the survey.`,
  }]
}

/** Every issue that stops a stage change, given the stage's data after the change. */
export function stageGateIssues(key: string, data: Record<string, unknown>, closing: boolean, context: GateContext): FieldIssue[] {
  if (key === 'leak-test') return leakTestIssues(data, closing, context.now)
  if (key === 'site-survey') return siteSurveyIssues(data, closing, context.surveyLoadRatio)
  return []
}
