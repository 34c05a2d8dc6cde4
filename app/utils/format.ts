import { litresToUsGallons } from '#shared/units'
import type { UnitSystem } from '#shared/vocabulary'

/** A volume in the user's units: US gallons or litres, to the nearest whole unit. */
export function formatVolume(litres: number, units: UnitSystem): string {
  return units === 'us' ? `${Math.round(litresToUsGallons(litres))} gal` : `${Math.round(litres)} L`
}

/** Whole days between an ISO start and now. */
export function daysSince(iso: string | null | undefined, now = Date.now()): number | null {
  if (!iso) return null
  return Math.max(0, Math.floor((now - new Date(iso).getTime()) / 86_400_000))
}
