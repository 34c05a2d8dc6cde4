/**
 * Plain-language progress of a build plan, for the client's view and the tank list.
 * Pure: the same words on server and client.
 */
import type { StageStatus } from '../vocabulary'

export interface StageProgressInput {
  key: string
  title: string
  status: StageStatus
}

/** What the client is told about each default stage while it is the current one. */
export const NEXT_STEP_WORDS: Record<string, string> = {
  'site-survey': 'Your aquarist checks the room first: light from windows, the floor, the stand and the power outlets near the tank.',
  'leak-test': 'The empty tank is filled with fresh water and left for a day or two to prove that no seam or fitting leaks.',
  'rinse-prepare': 'The tank is drained and the pumps, heater and filter media are rinsed before anything goes in.',
  'substrate': 'Sand goes in next, rinsed and laid to an even depth.',
  'rockwork': 'The rock is checked for pests and built into a stable structure on the tank floor.',
  'water-fill': 'The tank is filled with sea water mixed to the right salinity.',
  'cycling': 'The tank now grows the bacteria that make fish waste harmless. This takes a few weeks; daily water tests show how it is going. No animals go in until it is done.',
  'lighting-ramp': 'The lights are set to come on and off gently, then brightened week by week so corals can adjust.',
  'first-livestock': 'The first animals go in, a few at a time, with a water test after each addition.',
}

/** The first stage that is neither done nor skipped, or undefined when every stage is. */
export function currentStage<T extends StageProgressInput>(stages: readonly T[]): T | undefined {
  return stages.find(s => s.status !== 'done' && s.status !== 'skipped')
}

/** Finished (done or skipped) over total, 0-1; an empty plan counts as not begun. */
export function planFraction(stages: readonly StageProgressInput[]): number {
  if (!stages.length) return 0
  return stages.filter(s => s.status === 'done' || s.status === 'skipped').length / stages.length
}

/** One or two sentences on what happens next. */
export function whatHappensNext(stages: readonly StageProgressInput[]): string {
  const stage = currentStage(stages)
  if (!stage) return 'Every stage of the build plan is finished. Your aquarist will tell you about anything further.'
  const words = NEXT_STEP_WORDS[stage.key] ?? `Next in the plan: ${stage.title}.`
  return stage.status === 'in-progress' ? `Under way now — ${stage.title}. ${words}` : `Next — ${stage.title}. ${words}`
}

/** Whole and fractional hours between two ISO times, or null when either is missing or the end is first. */
export function elapsedHours(startIso: string | null | undefined, endIso: string | null | undefined): number | null {
  if (!startIso || !endIso) return null
  const ms = new Date(endIso).getTime() - new Date(startIso).getTime()
  if (!Number.isFinite(ms) || ms < 0) return null
  return ms / 3_600_000
}
