/**
 * The engine's messages speak canonical nitrogen ("1.23 mg/L as N (about 1.5 ppm as NH3)").
 * A client reads a kit on one basis, so for them each concentration is restated as their
 * kit reads it ("1.5 ppm as NH3"). The species is the nearest ammonia, nitrite or nitrate
 * named before the number; free (un-ionized) ammonia is NH3 by definition.
 */
import { formatNumber } from '../cycle/words'
import { nitrogenToKit, type KitBasisChoice } from './entry'

const CONCENTRATION = /(\d+(?:\.\d+)?) mg\/L as N(?: \(about [\d.]+ ppm as (?:NH3|NH4|NO2|NO3)\))?/g
const SPECIES = /\b(free \(toxic\) ammonia|free ammonia|ammonia|nitrite|nitrate)\b/gi

/** The basis a kit reads a species in, as words: "ppm as NH3", "ppm as N". */
function kitUnit(basis: string): string {
  return `ppm as ${basis}`
}

/** The message with every "mg/L as N" concentration restated in the kit's basis; others left as they are. */
export function inKitUnits(message: string, kit: KitBasisChoice): string {
  return message.replace(CONCENTRATION, (match, value: string, offset: number) => {
    const before = message.slice(0, offset)
    const named = [...before.matchAll(SPECIES)].at(-1)?.[1]?.toLowerCase()
    if (!named) return match
    const n = Number(value)
    if (named.startsWith('free')) {
      const basis = kit.ammonia === 'N' ? 'N' : 'NH3'
      return `${formatNumber(nitrogenToKit(n, basis))} ${kitUnit(basis)}`
    }
    const basis = named === 'ammonia' ? kit.ammonia : named === 'nitrite' ? kit.nitrite : kit.nitrate
    return `${formatNumber(nitrogenToKit(n, basis))} ${kitUnit(basis)}`
  })
}
