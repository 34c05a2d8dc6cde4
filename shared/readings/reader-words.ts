/**
 * The engine writes one canonical text: nitrogen as mg/L as N, degrees Celsius, litres and
 * moments in UTC. Whoever reads it — on the tank page, in a notice, in an e-mail — reads it in
 * their own units and on their own clock, so the danger text agrees with every figure beside
 * it; a client also reads each concentration as their kit does. This is the one place that
 * restates engine text for a reader.
 */
import { formatNumber } from '../cycle/words'
import { celsiusToFahrenheit, litresToUsGallons } from '../units'
import type { UnitSystem } from '../vocabulary'
import type { KitBasisChoice } from './entry'
import { inKitUnits } from './kit-words'

export interface Reader {
  units: UnitSystem
  /** A moment (epoch ms) as this reader's clock shows it. */
  when: (ms: number) => string
  /** Set for a client: concentrations restated in the kit's basis, from the readings' exact values (mg/L as N). */
  kit?: { basis: KitBasisChoice, exactN: readonly (number | null | undefined)[] }
}

// "25.2 C", "22-29 C": the engine writes temperatures with a bare C after a space.
const TEMPERATURE = /(-?\d+(?:\.\d+)?)(?:-(\d+(?:\.\d+)?))? C\b/g
// "about 101 L": a volume is a number, a space and a bare L (mg/L never has a space before the L).
const VOLUME = /(\d+(?:\.\d+)?) L\b/g
// "2026-12-02 08:01 UTC", as shared/cycle/time.ts formatWhen writes it.
const MOMENT = /(\d{4})-(\d{2})-(\d{2}) (\d{2}):(\d{2}) UTC/g
// "2026-12-02" left after the moments: a calendar day the engine names (a re-test schedule, say).
const DAY = /\b(\d{4})-(\d{2})-(\d{2})\b/g

function temperature(celsius: string, units: UnitSystem): string {
  return units === 'us' ? formatNumber(celsiusToFahrenheit(Number(celsius))) : celsius
}

/** The engine's message restated for one reader. */
export function forReader(message: string, reader: Reader): string {
  const inKit = reader.kit ? inKitUnits(message, reader.kit.basis, reader.kit.exactN) : message
  const degree = reader.units === 'us' ? '°F' : '°C'
  return inKit
    .replace(TEMPERATURE, (_, low: string, high: string | undefined) =>
      `${temperature(low, reader.units)}${high === undefined ? '' : `-${temperature(high, reader.units)}`} ${degree}`)
    .replace(VOLUME, (match, litres: string) => (reader.units === 'us' ? `${formatNumber(litresToUsGallons(Number(litres)))} gal` : match))
    .replace(MOMENT, (_, y: string, mo: string, d: string, h: string, mi: string) =>
      reader.when(Date.UTC(Number(y), Number(mo) - 1, Number(d), Number(h), Number(mi))))
    // A day is a day: written as the calendar day it names ("Dec 2"), not moved to another clock.
    .replace(DAY, (_, y: string, mo: string, d: string) => formatShortDay(Date.UTC(Number(y), Number(mo) - 1, Number(d)), 'UTC'))
}

/**
 * A moment, short ("Dec 2, 3:01 PM"), in a time zone: the company's for mail and notices, the
 * browser's own when none is given. One format for every moment a person reads.
 */
export function formatMoment(ms: number, timeZone?: string): string {
  return new Date(ms).toLocaleString('en-US', { timeZone, day: 'numeric', month: 'short', hour: 'numeric', minute: '2-digit' })
}

/** A day without its year ("Dec 2"), where the year is plain from around it: chart axes, a range's first end. */
export function formatShortDay(ms: number, timeZone?: string): string {
  return new Date(ms).toLocaleDateString('en-US', { timeZone, day: 'numeric', month: 'short' })
}

/** A calendar day ("Dec 2, 2026") on a clock: earliest dates, sign-off days, forecasts. */
export function formatDay(ms: number, timeZone?: string): string {
  return new Date(ms).toLocaleDateString('en-US', { timeZone, day: 'numeric', month: 'short', year: 'numeric' })
}

/** A moment with its year ("Dec 2, 2026, 3:01 PM"), for records that outlive the season: sign-offs, audit rows, sign-ins. */
export function formatStamp(ms: number, timeZone?: string): string {
  return new Date(ms).toLocaleString('en-US', { timeZone, day: 'numeric', month: 'short', year: 'numeric', hour: 'numeric', minute: '2-digit' })
}
