import { defineStore } from 'pinia'
import { useLocalStorage } from '@vueuse/core'
import * as v from 'valibot'
import { SG_BASIS_KEYS } from '#shared/readings/entry'
import { SALINITY_MODES, type SalinityMode } from '#shared/vocabulary'

/** How a person measures a tank's salinity: the instrument's mode and, for a hydrometer or refractometer, its scale. */
export interface SalinityInstrument {
  mode: SalinityMode
  sgBasis: (typeof SG_BASIS_KEYS)[number]
}

const Instrument = v.object({ mode: v.picklist(SALINITY_MODES), sgBasis: v.picklist(SG_BASIS_KEYS) })

/**
 * The salinity instrument each tank was last tested with on this device, so the daily form
 * opens the way the person measures (a hydrometer in specific gravity, say) instead of
 * practical salinity every visit. Kept in the browser's storage: the instrument is in the
 * hands of whoever tests, and an aquarist and a client may each use their own.
 */
export const useInstrumentsStore = defineStore('instruments', () => {
  const byTank = useLocalStorage<Record<string, unknown>>('tidewright.salinity-instruments', {})

  /** The remembered instrument, or null (none yet, or storage holding something else). */
  function salinityFor(tankId: string): SalinityInstrument | null {
    const parsed = v.safeParse(Instrument, byTank.value[tankId])
    return parsed.success ? parsed.output : null
  }

  function rememberSalinity(tankId: string, instrument: SalinityInstrument): void {
    byTank.value = { ...byTank.value, [tankId]: instrument }
  }

  return { salinityFor, rememberSalinity }
})
