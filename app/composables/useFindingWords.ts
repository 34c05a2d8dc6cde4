import type { Finding } from '#shared/cycle/types'
import { findingForClient, type ClientFinding, type MeasuredValues } from '#shared/readings/finding-words'
import { formatMoment } from '#shared/readings/reader-words'
import { useReaderWords, type ReaderKit } from './useReaderWords'

/**
 * A finding in the reader's voice: a client gets the plain sentence for its rule with the
 * engine's reason as the "why" (`shared/readings/finding-words.ts`); staff get the engine's text
 * (the rule id and source are shown beside it). `measured`: the values the finding's tests read.
 */
export function useFindingWords(kit: () => ReaderKit | undefined, measured: (finding: Finding) => MeasuredValues) {
  const me = useMeStore()
  const words = useReaderWords(kit)
  return (finding: Finding): ClientFinding => (me.isClient
    ? findingForClient(finding, measured(finding), { units: me.units, when: ms => formatMoment(ms, me.timeZone), kit: kit() })
    : { text: words(finding.message), why: null })
}
