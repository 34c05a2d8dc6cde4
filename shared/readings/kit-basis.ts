/**
 * A kit's reading "as ion" or "as N" to and from mg/L as N. Apart from entry.ts so that what
 * only restates stored values for a reader (kit-words, charts, mail) does not bring the whole
 * entry check with it: the attention board's browser script loads these lines, not entry's.
 */
import { fromNitrogen, toNitrogen, type NitrogenSpecies } from '../chemistry/nitrogen'
import type { AmmoniaBasis, NitrateBasis, NitriteBasis } from '../vocabulary'

/** Kit value in its basis -> mg/L as N. */
export function nitrogenFromKit(value: number, basis: AmmoniaBasis | NitriteBasis | NitrateBasis): number {
  return basis === 'N' ? value : toNitrogen(value, basis as NitrogenSpecies)
}

/** mg/L as N -> the kit's basis (for display and for editing a stored reading). */
export function nitrogenToKit(valueN: number, basis: AmmoniaBasis | NitriteBasis | NitrateBasis): number {
  return basis === 'N' ? valueN : fromNitrogen(valueN, basis as NitrogenSpecies)
}
