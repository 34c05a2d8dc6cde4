import type { CycleAction } from '#shared/cycle/types'
import { actionForClient, type ClientAction } from '#shared/readings/action-words'
import { formatMoment } from '#shared/readings/reader-words'
import { useReaderWords, type ReaderKit } from './useReaderWords'

/**
 * What to do next, in the reader's voice: a client gets the plain sentence for the action's kind
 * with the engine's text as the "why" (`shared/readings/action-words.ts`); staff get the engine's text.
 */
export function useActionWords(kit: () => ReaderKit | undefined) {
  const me = useMeStore()
  const words = useReaderWords(kit)
  return (action: Pick<CycleAction, 'kind' | 'message' | 'waterChangePercent'>): ClientAction => (me.isClient
    ? actionForClient(action, { units: me.units, when: ms => formatMoment(ms, me.timeZone), kit: kit() })
    : { text: words(action.message), why: null })
}
