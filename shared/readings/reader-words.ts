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

type ClockStyle = 'moment' | 'short-day' | 'day' | 'stamp'
/** The language every date and time is written in, on both sides. */
export const CLOCK_LOCALE = 'en-US'
const CLOCK_STYLES: Record<ClockStyle, Intl.DateTimeFormatOptions> = {
  'moment': { day: 'numeric', month: 'short', hour: 'numeric', minute: '2-digit' },
  'short-day': { day: 'numeric', month: 'short' },
  'day': { day: 'numeric', month: 'short', year: 'numeric' },
  'stamp': { day: 'numeric', month: 'short', year: 'numeric', hour: 'numeric', minute: '2-digit' },
}
// One formatter per style and time zone, made on first use: `toLocaleString` with options builds
// a new one on every call (about 0.1 ms each), and a page prints many dates (a board's forecasts,
// a chart's axis ticks and tooltips), the server's render and the browser's hydration alike.
const formatters = new Map<string, Intl.DateTimeFormat>()
function onClock(style: ClockStyle, ms: number, timeZone: string | undefined): string {
  const key = `${style} ${timeZone ?? ''}`
  let formatter = formatters.get(key)
  if (!formatter) {
    formatter = new Intl.DateTimeFormat(CLOCK_LOCALE, { ...CLOCK_STYLES[style], timeZone })
    formatters.set(key, formatter)
  }
  // A formatter throws on a time that is not one, where toLocaleString said "Invalid Date".
  return Number.isNaN(ms) ? String(new Date(ms)) : formatter.format(ms)
}

/**
 * A moment, short ("Dec 2, 3:01 PM"), in a time zone: the company's for mail and notices, the
 * browser's own when none is given. One format for every moment a person reads.
 */
export function formatMoment(ms: number, timeZone?: string): string {
  return onClock('moment', ms, timeZone)
}

/** A day without its year ("Dec 2"), where the year is plain from around it: chart axes, a range's first end. */
export function formatShortDay(ms: number, timeZone?: string): string {
  return onClock('short-day', ms, timeZone)
}

/** A calendar day ("Dec 2, 2026") on a clock: earliest dates, sign-off days, forecasts. */
export function formatDay(ms: number, timeZone?: string): string {
  return onClock('day', ms, timeZone)
}

/** A moment with its year ("Dec 2, 2026, 3:01 PM"), for records that outlive the season: sign-offs, audit rows, sign-ins. */
export function formatStamp(ms: number, timeZone?: string): string {
  return onClock('stamp', ms, timeZone)
}
