import type { KitBasisChoice } from '#shared/readings/entry'
import { nitrogenToKit, temperatureFromC } from '#shared/readings/entry'
import type { UnitSystem } from '#shared/vocabulary'

/** A number rounded for a reading table: at most `digits` decimals, no trailing zeros. */
export function roundReading(value: number | null | undefined, digits = 2): string {
  if (value === null || value === undefined) return '—'
  const f = 10 ** digits
  return String(Math.round(value * f) / f)
}

/** A nitrogen value (mg/L as N) in the chosen basis, for display. */
export function showNitrogen(valueN: number | null, basis: KitBasisChoice[keyof KitBasisChoice]): string {
  return valueN === null ? '—' : roundReading(nitrogenToKit(valueN, basis), 2)
}

/** A temperature in the user's units. */
export function showTemperature(valueC: number | null, units: UnitSystem): string {
  return valueC === null ? '—' : `${roundReading(temperatureFromC(valueC, units === 'us' ? 'F' : 'C'), 1)} °${units === 'us' ? 'F' : 'C'}`
}

/** A Date as the value of an <input type="datetime-local"> in local time. */
export function toLocalInput(date: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0')
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}T${pad(date.getHours())}:${pad(date.getMinutes())}`
}

/** The label of a kit basis. */
export function basisLabel(basis: string): string {
  return basis === 'N' ? 'as N' : `as ${basis.replace(/(\d)/, '$1')}`
}
