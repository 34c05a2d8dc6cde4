/**
 * What to do next, in a client's words. Each action the engine proposes carries its kind (and,
 * for a water change, the percentage), so a client's sentence is keyed on the kind; the engine's
 * text, restated in the reader's units, is the "why" (it holds the doses and the checks in
 * full). Kinds whose engine text already reads plainly (which tests, by when) are listed in
 * `PLAIN_ACTION_KINDS`. A unit test fails on an action kind in neither. Staff read the engine's text.
 */
import type { CycleAction } from '../cycle/types'
import { formatPercent } from '../cycle/words'
import { forReader, type Reader } from './reader-words'

type ActionSentence = (action: Pick<CycleAction, 'kind' | 'waterChangePercent'>) => string

/** The client's sentence for each action kind whose engine text speaks the aquarist's language. */
export const CLIENT_ACTION_WORDS: Readonly<Record<string, ActionSentence>> = Object.freeze({
  'water-change': a => `Change ${a.waterChangePercent ? formatPercent(a.waterChangePercent) : 'some'} of the water now, with new salt water at the tank's temperature and salinity.`,
  'start-cycle': () => 'Start the cycle: add the ammonia dose and the bottled bacteria your aquarist set, note both here, then test ammonia and nitrite every day.',
  'clearance-test': () => 'Add today\'s test dose of ammonia (the amount is under "Why?") and note it here; test ammonia a few hours later, and ammonia and nitrite again before the next dose.',
  'lower-dose': () => 'Use smaller ammonia doses until nitrite comes down (the amounts are under "Why?").',
  'check-stall': () => 'The cycle seems stuck: tell your aquarist. The usual causes, and what helps, are under "Why?".',
})

/** Action kinds whose engine text a client reads as it is: which tests to take, or a plain dose, and by when. */
export const PLAIN_ACTION_KINDS: readonly string[] = ['test-now', 'retest', 'test-nitrate', 'dose-ammonia']

/** An action as a client reads it. */
export interface ClientAction {
  text: string
  /** The engine's text in the reader's units; null when the text already is the engine's own. */
  why: string | null
}

/** An action in the client's words, with the engine's text (in their units) as its "why"; a plain or unknown kind is restated. */
export function actionForClient(action: Pick<CycleAction, 'kind' | 'message' | 'waterChangePercent'>, reader: Reader): ClientAction {
  const reason = forReader(action.message, reader)
  const sentence = CLIENT_ACTION_WORDS[action.kind]
  return sentence ? { text: sentence(action), why: reason } : { text: reason, why: null }
}
