import { celsiusToFahrenheit } from '#shared/units'
import type { SignOffStatus } from '#shared/types/sign-off'
import type { UnitSystem } from '#shared/vocabulary'

/** Plain words for a sign-off's state. */
export const SIGN_OFF_STATUS_LABELS: Record<SignOffStatus, string> = {
  requested: 'Waiting for the supervisor',
  approved: 'Signed off',
  returned: 'Returned to the aquarist',
  reopened: 'Reopened',
}

/** A nitrogen value, mg/L as N, or a dash. */
export function formatN(value: number | null | undefined): string {
  return value === null || value === undefined ? '—' : value.toFixed(2)
}

/** A temperature in the user's units. */
export function formatTemperature(celsius: number | null | undefined, units: UnitSystem): string {
  if (celsius === null || celsius === undefined) return '—'
  return units === 'us' ? `${celsiusToFahrenheit(celsius).toFixed(1)} °F` : `${celsius.toFixed(1)} °C`
}
