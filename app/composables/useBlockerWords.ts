import { formatMoment } from '#shared/readings/reader-words'
import { blockerForClient, blockerRule, type ClientBlocker } from '#shared/readings/readiness-words'
import { useReaderWords, type ReaderKit } from './useReaderWords'

/**
 * Why a livestock group waits, in the reader's voice: a client gets the plain sentence for the
 * readiness rule that wrote it with the engine's text as the "why"
 * (`shared/readings/readiness-words.ts`); staff get the engine's text with the rule beside it.
 */
export function useBlockerWords(kit: () => ReaderKit | undefined) {
  const me = useMeStore()
  const words = useReaderWords(kit)
  return (blocker: string): ClientBlocker => (me.isClient
    ? blockerForClient(blocker, { units: me.units, when: ms => formatMoment(ms, me.timeZone), kit: kit() })
    : { ruleId: blockerRule(blocker), text: words(blocker), why: null })
}
