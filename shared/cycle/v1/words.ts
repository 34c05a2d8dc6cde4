/**
 * Number formatting for messages. Clients read kits "as ion" or "as nitrogen", so
 * every concentration in a message says which basis it is on.
 */

import { fromNitrogen, type NitrogenSpecies } from '../../chemistry/nitrogen'

/** Rounds for display: three decimals below 0.1 (the EPA limits live there), two below 1, one above. */
export function formatNumber(value: number): string {
  const size = Math.abs(value)
  const decimals = size === 0 ? 0 : size < 0.1 ? 3 : size < 1 ? 2 : 1
  const scale = 10 ** decimals
  return String(Math.round(value * scale) / scale)
}

/** "0.41 mg/L as N". */
export function mgN(value: number): string {
  return `${formatNumber(value)} mg/L as N`
}

/** A whole-number percent for water changes; a partial percent is not something anyone can measure out. */
export function formatPercent(value: number): string {
  return `${Math.ceil(value)} %`
}

/** "0.41 mg/L as N (about 0.5 ppm as NH3)": both bases, for whichever kind of kit the client owns. */
export function mgNWithIon(valueN: number, species: NitrogenSpecies): string {
  return `${mgN(valueN)} (about ${formatNumber(fromNitrogen(Math.max(0, valueN), species))} ppm as ${species})`
}
