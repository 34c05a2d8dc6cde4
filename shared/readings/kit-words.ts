/**
 * The engine's messages speak canonical nitrogen ("1.23 mg/L as N (about 1.5 ppm as NH3)").
 * A client reads a kit on one basis, so for them each concentration is restated as their
 * kit reads it ("1.5 ppm as NH3"). The species is the ion written beside the number, else the
 * nearest ammonia, nitrite or nitrate named before it; free (un-ionized) ammonia is NH3 by definition.
 */
import { formatNumber } from '../cycle/words'
import type { KitBasisChoice } from './entry'
import { nitrogenToKit } from './kit-basis'

const CONCENTRATION = /(\d+(?:\.\d+)?) mg\/L as N(?: \(about ([\d.]+) ppm as (NH3|NH4|NO2|NO3)\))?/g
// The ion the engine wrote beside a figure names its species for sure (a dose of ammonia in a sentence about nitrite).
const ION_SPECIES: Record<string, string> = { NH3: 'ammonia', NH4: 'ammonia', NO2: 'nitrite', NO3: 'nitrate' }
const SPECIES = /\b(free \(toxic\) ammonia|free ammonia|ammonia|nitrite|nitrate)\b/gi

/** The basis a kit reads a species in, as words: "ppm as NH3", "ppm as N". */
function kitUnit(basis: string): string {
  return `ppm as ${basis}`
}

/** A concentration (mg/L as N) as a kit on `basis` reads it: "2 ppm as NH3". */
export function kitReads(valueN: number, basis: KitBasisChoice[keyof KitBasisChoice]): string {
  return `${formatNumber(nitrogenToKit(valueN, basis))} ${kitUnit(basis)}`
}

/**
 * The exact value a rounded number in a message stands for: the messages round (1.64 reads
 * "1.6"), and converting the rounded figure would show a client who typed 2 ppm "1.9 ppm".
 */
function unrounded(value: string, exactN: readonly number[]): number {
  const n = Number(value)
  const halfStep = 0.5 * 10 ** -(value.split('.')[1]?.length ?? 0)
  return exactN.find(e => Math.abs(e - n) <= halfStep + 1e-9) ?? n
}

/**
 * The message with every "mg/L as N" concentration restated in the kit's basis; others left as
 * they are. `exactN`: the readings' own values (mg/L as N) the message may have rounded.
 */
export function inKitUnits(message: string, kit: KitBasisChoice, exactN: readonly (number | null | undefined)[] = []): string {
  const exact = exactN.filter((e): e is number => typeof e === 'number')
  return message.replace(CONCENTRATION, (match, value: string, ionValue: string | undefined, ion: string | undefined, offset: number) => {
    const before = message.slice(0, offset)
    const nearest = [...before.matchAll(SPECIES)].at(-1)?.[1]?.toLowerCase()
    const n = unrounded(value, exact)
    if (nearest?.startsWith('free')) {
      return kitReads(n, kit.ammonia === 'N' ? 'N' : 'NH3')
    }
    const named = (ion && ION_SPECIES[ion]) ?? nearest
    if (!named) return match
    const basis = named === 'ammonia' ? kit.ammonia : named === 'nitrite' ? kit.nitrite : kit.nitrate
    // Not a reading's figure: the engine's own in the kit's basis was worked from the unrounded value (1.645 as N is "2 ppm as NH3", not 1.6 restated).
    if (ion === basis && ionValue !== undefined && n === Number(value)) return `${ionValue} ${kitUnit(basis)}`
    return kitReads(n, basis)
  })
}
