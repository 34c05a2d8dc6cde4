import { defineStore } from 'pinia'
import { useLocalStorage } from '@vueuse/core'
import * as v from 'valibot'
import { SalinityInstrumentSchema, type SalinityInstrument } from '#shared/schemas/salinity-instrument'

export type { SalinityInstrument }

/**
 * The salinity instrument each tank was last tested with, so the daily form opens the way the
 * person measures (a hydrometer in specific gravity, say) instead of practical salinity every
 * visit. The server keeps it per person and tank (`/api/tanks/:id/salinity-instrument`), so a
 * phone and a laptop agree; this device's copy in the browser's storage is the fast first value
 * while the server's answer is on its way, and the only one when the network is down.
 */
export const useInstrumentsStore = defineStore('instruments', () => {
  const byTank = useLocalStorage<Record<string, unknown>>('tidewright.salinity-instruments', {})

  /** This device's remembered instrument, or null (none yet, or storage holding something else). */
  function salinityFor(tankId: string): SalinityInstrument | null {
    const parsed = v.safeParse(SalinityInstrumentSchema, byTank.value[tankId])
    return parsed.success ? parsed.output : null
  }

  function keepOnDevice(tankId: string, instrument: SalinityInstrument): void {
    byTank.value = { ...byTank.value, [tankId]: instrument }
  }

  /** The person's instrument for the tank as the server remembers it (kept on this device too), or null. */
  async function loadSalinity(tankId: string): Promise<SalinityInstrument | null> {
    const { instrument } = await $fetch<{ instrument: SalinityInstrument | null }>(`/api/tanks/${tankId}/salinity-instrument`)
    if (instrument) keepOnDevice(tankId, instrument)
    return instrument
  }

  /** Remembers the instrument on this device at once and on the server for the person's other devices. */
  async function rememberSalinity(tankId: string, instrument: SalinityInstrument): Promise<void> {
    keepOnDevice(tankId, instrument)
    await $fetch(`/api/tanks/${tankId}/salinity-instrument`, { method: 'PUT', body: instrument })
  }

  return { salinityFor, loadSalinity, rememberSalinity }
})
