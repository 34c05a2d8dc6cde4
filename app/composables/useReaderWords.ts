import type { KitBasisChoice } from '#shared/readings/entry'
import { formatMoment, forReader } from '#shared/readings/reader-words'

/**
 * Engine texts as the signed-in person reads them: their units, the company's clock, and for a
 * client each concentration in the kit's basis (`kit`). Staff keep canonical nitrogen.
 */
export function useReaderWords(kit?: () => { basis: KitBasisChoice, exactN: readonly (number | null | undefined)[] } | undefined) {
  const me = useMeStore()
  return (message: string): string => forReader(message, {
    units: me.units,
    when: ms => formatMoment(ms, me.timeZone),
    kit: me.isClient ? kit?.() : undefined,
  })
}
