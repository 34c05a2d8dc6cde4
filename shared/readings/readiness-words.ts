/**
 * Why animals may not go in yet, in a client's words. The engine gives each livestock group its
 * blockers as the aquarist's text only (no rule id rides with it, and adding one would change
 * every signed verdict), but each readiness rule in `shared/cycle/rules/readiness.ts` writes its
 * blockers in a fixed form. Each rule here names that form and a plain sentence; the engine's
 * text, restated in the reader's units, is the "why". A blocker in no known form (an older rule
 * set's wording) is shown restated, as before. Staff read the engine's text with its rule.
 */
import { forReader, type Reader } from './reader-words'

/** A plain sentence for one readiness rule's blockers, picked out by the form the rule writes them in. */
interface BlockerWords {
  /** True for a blocker this rule wrote. */
  readonly wrote: (blocker: string) => boolean
  /** The client's sentence; null when the engine's text already reads plainly. */
  readonly say: (blocker: string) => string | null
}

const REEF_VALUE = /^(Alkalinity|Calcium|Magnesium) (has never been tested|is )/

/**
 * Every readiness rule's client words, in the engine's order (checked in this order, so the
 * danger and environment forms, which quote other texts, are tried first). A unit test fails on
 * a readiness rule with no entry here.
 */
export const CLIENT_BLOCKER_WORDS: Readonly<Record<string, BlockerWords>> = Object.freeze({
  'readiness.cycle-complete': {
    wrote: b => b.startsWith('Not yet: '),
    say: () => 'No animals go in until the tank has finished its cycle: keep testing every day, and the page will say when it is ready.',
  },
  'readiness.fish-already-in': {
    wrote: b => b.startsWith('Fish are already in the tank'),
    say: () => 'The fish already in the tank are enough for now: add no more until the cycle has finished.',
  },
  'readiness.no-danger': {
    wrote: b => b.startsWith('Not while this is unresolved: '),
    say: () => 'No new animals until the danger shown on this page is put right.',
  },
  'readiness.environment': {
    wrote: b => /^(Salinity|Temperature) is /.test(b),
    say: b => b.startsWith('Salinity')
      ? 'No new animals until salinity is back in the usual range for a reef tank.'
      : 'No new animals until the water temperature is back in the usual range for a reef tank.',
  },
  'readiness.coral-wait': {
    wrote: b => / wait \d+ days after the cycle completed /.test(b),
    say: () => 'These corals need the tank to settle for a while after its cycle finished; the earliest day is shown beside them.',
  },
  'readiness.salinity-stable': {
    wrote: b => b.startsWith('Stony corals need salinity held'),
    say: () => 'Stony corals need the salinity to stay steady for some days first: top up evaporated water with fresh water every day and keep testing salinity.',
  },
  'readiness.reef-chemistry': {
    wrote: b => REEF_VALUE.test(b),
    say: (b) => {
      const [, name, form] = REEF_VALUE.exec(b) ?? []
      return form === 'is '
        ? `${name} is outside the range stony corals need; your aquarist can tell you how to bring it back.`
        : `${name} has not been tested yet: stony corals need it tested, and in range, first.`
    },
  },
  'readiness.nitrate': {
    wrote: b => b.startsWith('Nitrate is '),
    say: () => 'Nitrate is too high for these animals yet: a water change brings it down.',
  },
  'readiness.phosphate': {
    wrote: b => b.startsWith('Phosphate is '),
    say: () => 'Phosphate is too high for these animals yet: water changes or a phosphate remover bring it down.',
  },
  'readiness.ph': {
    wrote: b => b.startsWith('pH '),
    say: b => b.startsWith('pH has not been tested')
      ? 'Test pH before any animals go in.'
      : 'pH is outside the usual range for a reef tank: test again to be sure before any animals go in.',
  },
  'readiness.stocking-rate': {
    wrote: b => / more fish wait until /.test(b),
    say: () => 'Fish go in a few at a time: the tank\'s bacteria need a little while to catch up with the last ones before more go in.',
  },
  'readiness.fish-first': {
    wrote: b => b.startsWith('Corals go in only after the tank is ready for fish'),
    say: () => null,
  },
})

/** A blocker as a client reads it, and the readiness rule that wrote it (null when its form is not known). */
export interface ClientBlocker {
  ruleId: string | null
  text: string
  /** The engine's reason in the reader's units; null when the text already is the engine's own. */
  why: string | null
}

/** The readiness rule that wrote a blocker, or null for a form no rule here writes. */
export function blockerRule(blocker: string): string | null {
  return Object.entries(CLIENT_BLOCKER_WORDS).find(([, words]) => words.wrote(blocker))?.[0] ?? null
}

/** A blocker in the client's words, with the engine's reason (in their units) as its "why". */
export function blockerForClient(blocker: string, reader: Reader): ClientBlocker {
  const reason = forReader(blocker, reader)
  const ruleId = blockerRule(blocker)
  const sentence = ruleId === null ? null : CLIENT_BLOCKER_WORDS[ruleId]!.say(blocker)
  return sentence ? { ruleId, text: sentence, why: reason } : { ruleId, text: reason, why: null }
}
