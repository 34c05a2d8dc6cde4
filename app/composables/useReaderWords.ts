import type { KitBasisChoice } from '#shared/readings/entry'
import { formatMoment, forReader, type Reader } from '#shared/readings/reader-words'

/** The tank's kit and the exact values (mg/L as N) a client's words restate concentrations from. */
export type ReaderKit = { basis: KitBasisChoice, exactN: readonly (number | null | undefined)[] }

/**
 * Engine texts as the signed-in person reads them: their units and the company's clock, every
 * concentration as the tank's kit reads it. Staff who switched to canonical units
 * (`useMeStore().showCanonicalUnits`) read the engine's own: mg/L as N, °C and litres.
 */
export function useReaderWords(kit?: () => ReaderKit | undefined) {
  const me = useMeStore()
  const reader = (): Reader => (me.canonicalUnits
    ? { units: 'metric', when: ms => formatMoment(ms, me.timeZone) }
    : { units: me.units, when: ms => formatMoment(ms, me.timeZone), kit: kit?.() })
  return (message: string): string => forReader(message, reader())
}
