import type { KitBasisChoice } from '#shared/readings/entry'
import { formatMoment, forReader } from '#shared/readings/reader-words'

/**
 * Engine texts as the signed-in person reads them: their units, the browser's clock, and for a
 * client each concentration in the kit's basis (`kit`). Staff keep canonical nitrogen.
 */
export function useReaderWords(kit?: () => { basis: KitBasisChoice, exactN: readonly (number | null | undefined)[] } | undefined) {
  const { user } = useUserSession()
  const isClient = computed(() => user.value?.role === 'client')
  return (message: string): string => forReader(message, {
    units: user.value?.units ?? 'metric',
    when: ms => formatMoment(ms),
    kit: isClient.value ? kit?.() : undefined,
  })
}
