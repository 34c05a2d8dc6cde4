import type { CycleAction, Finding } from '#shared/cycle/types'
import { actionForClient, type ClientAction } from '#shared/readings/action-words'
import type { KitBasisChoice } from '#shared/readings/entry'
import { findingForClient, type ClientFinding, type MeasuredValues } from '#shared/readings/finding-words'
import { formatMoment, forReader, type Reader } from '#shared/readings/reader-words'
import { blockerForClient, blockerRule, type ClientBlocker } from '#shared/readings/readiness-words'

type Kit = { basis: KitBasisChoice, exactN: readonly (number | null | undefined)[] }

/**
 * Engine texts as the signed-in person reads them: their units and the company's clock, every
 * concentration as the tank's kit reads it. Staff who switched to canonical units
 * (`useMeStore().showCanonicalUnits`) read the engine's own: mg/L as N, °C and litres.
 */
export function useReaderWords(kit?: () => Kit | undefined) {
  const me = useMeStore()
  const reader = (): Reader => (me.canonicalUnits
    ? { units: 'metric', when: ms => formatMoment(ms, me.timeZone) }
    : { units: me.units, when: ms => formatMoment(ms, me.timeZone), kit: kit?.() })
  return (message: string): string => forReader(message, reader())
}

/**
 * A finding in the reader's voice: a client gets the plain sentence for its rule with the
 * engine's reason as the "why" (`shared/readings/finding-words.ts`); staff get the engine's text
 * (the rule id and source are shown beside it). `measured`: the values the finding's tests read.
 */
export function useFindingWords(kit: () => Kit | undefined, measured: (finding: Finding) => MeasuredValues) {
  const me = useMeStore()
  const words = useReaderWords(kit)
  return (finding: Finding): ClientFinding => (me.isClient
    ? findingForClient(finding, measured(finding), { units: me.units, when: ms => formatMoment(ms, me.timeZone), kit: kit() })
    : { text: words(finding.message), why: null })
}

/**
 * Why a livestock group waits, in the reader's voice: a client gets the plain sentence for the
 * readiness rule that wrote it with the engine's text as the "why"
 * (`shared/readings/readiness-words.ts`); staff get the engine's text with the rule beside it.
 */
export function useBlockerWords(kit: () => Kit | undefined) {
  const me = useMeStore()
  const words = useReaderWords(kit)
  return (blocker: string): ClientBlocker => (me.isClient
    ? blockerForClient(blocker, { units: me.units, when: ms => formatMoment(ms, me.timeZone), kit: kit() })
    : { ruleId: blockerRule(blocker), text: words(blocker), why: null })
}

/**
 * What to do next, in the reader's voice: a client gets the plain sentence for the action's kind
 * with the engine's text as the "why" (`shared/readings/action-words.ts`); staff get the engine's text.
 */
export function useActionWords(kit: () => Kit | undefined) {
  const me = useMeStore()
  const words = useReaderWords(kit)
  return (action: Pick<CycleAction, 'kind' | 'message' | 'waterChangePercent'>): ClientAction => (me.isClient
    ? actionForClient(action, { units: me.units, when: ms => formatMoment(ms, me.timeZone), kit: kit() })
    : { text: words(action.message), why: null })
}
