/**
 * Two voices for one verdict. The engine writes each finding once, for the aquarist: canonical
 * nitrogen, the criterion's name and its source ("free (toxic) ammonia ... above the US EPA
 * long-term saltwater limit"). A client reads the same finding as a plain sentence keyed by its
 * rule id, with the value as their kit reads it ("Total ammonia is 2 ppm as NH3, as your kit
 * reads it"), and the engine's own text as the short "why" beneath. This is the one home of those
 * client sentences: the tank page, the save confirmation, notices and e-mails all ask it.
 * The engine's verdict is untouched; only its words change with the reader.
 */
import type { Finding, Severity } from '../cycle/types'
import { formatNumber } from '../cycle/words'
import { specificGravity } from '../chemistry/seawater'
import { celsiusToFahrenheit } from '../units'
import { kitReads } from './kit-words'
import { forReader, type Reader } from './reader-words'

/** What a finding's tests measured (canonical: mg/L as N, pH, degrees C, practical salinity); any may be missing. */
export interface MeasuredValues {
  ammoniaN?: number | null
  nitriteN?: number | null
  nitrateN?: number | null
  pH?: number | null
  temperatureC?: number | null
  salinity?: number | null
}

/** The measured values as the client reads them: kit units, their temperature unit, salinity with its usual SG. */
interface Said {
  ammonia?: string
  nitrite?: string
  pH?: string
  temperature?: string
  salinity?: string
  danger: boolean
}

/** A client sentence, or null when a value it needs was not measured (the engine's text, restated, is shown instead). */
type ClientSentence = (said: Said) => string | null | undefined

const KIT = ', as your kit reads it'

/**
 * The client's sentence for each finding whose engine text speaks the aquarist's language.
 * Every danger and caution rule has one, or is listed in `ALREADY_PLAIN` (a unit test fails on
 * a rule in neither); other findings read plainly once restated in the kit's units.
 */
export const CLIENT_FINDING_WORDS: Readonly<Record<string, ClientSentence>> = Object.freeze({
  'ammonia.action-threshold': s => s.ammonia && `Total ammonia is ${s.ammonia}${KIT}: too high for the animals in the tank. Change water now and feed lightly.`,
  'ammonia.free-acute': s => s.ammonia && `Total ammonia is ${s.ammonia}${KIT}, and at this tank's pH and temperature enough of it is in its harmful form to hurt animals within hours. Change water now.`,
  'ammonia.free-chronic': s => s.ammonia && `Total ammonia is ${s.ammonia}${KIT}: at this tank's pH and temperature that is more than animals should live with for long. Feed lightly and test ammonia, pH and temperature again within a day.`,
  'ammonia.free-chronic-average': () => 'Ammonia has been too high for the animals for several days. Change water now, feed very lightly and test every day.',
  'ammonia.free-unknown': s => s.ammonia && `Ammonia is ${s.ammonia}${KIT}, with animals in. Test pH and temperature each time you test ammonia: together they tell how much of it can harm the animals.`,
  'nitrite.high-with-animals': s => s.nitrite && (s.danger
    ? `Nitrite is ${s.nitrite}${KIT}: dangerous for the animals. Change some water now and watch them for fast breathing.`
    : `Nitrite is ${s.nitrite}${KIT}: more than the animals should live with. Change some water and watch them for fast breathing.`),
  'salinity.range': s => s.salinity && (s.danger
    ? `Salinity is ${s.salinity}: so far off that reef animals cannot live with it for long. Bring it back slowly, a little each day, with fresh water or salt mix, and call your aquarist.`
    : `Salinity is ${s.salinity}, outside the usual range for a reef tank. Bring it back slowly, a little each day, with fresh water or salt mix.`),
  'temperature.range': s => s.temperature && (s.danger
    ? `The water is ${s.temperature}: beyond what reef animals survive for long. Check the heater, the chiller and the room now.`
    : `The water is ${s.temperature}, outside the usual range for a reef tank. Check the heater, the chiller and the room.`),
  'ph.range': s => s.pH && (s.danger
    ? `pH is ${s.pH}: beyond what reef animals survive for long. Test again to be sure, then call your aquarist.`
    : `pH is ${s.pH}, outside the usual range for a reef tank. Test again to be sure; your aquarist can tell you what usually causes it.`),
  'cycle.lost': () => 'Ammonia or nitrite is back after the cycle had finished. The tank has to show clean tests again for a while before more animals go in: keep testing every day.',
  'cycle.clearance-failed': () => 'The last ammonia dose does not count toward proving the cycle (the reason is below). Keep dosing and testing as your aquarist planned.',
  'testing.nitrate-kit': () => 'Your nitrate test has read the same for a while, though the tank is clearing ammonia, which always leaves nitrate behind. The nitrate kit may be out of date or used the wrong way: check its date and instructions, or try another kit.',
  'cycle.stalled': () => 'The cycle seems stuck: ammonia or nitrite has stayed up for days. Tell your aquarist, and keep testing every day.',
  'livestock.ammonia-rise': s => s.ammonia && `Ammonia rose to ${s.ammonia}${KIT} after new animals went in: the tank's bacteria have not caught up yet. Feed lightly and test ammonia again within a day.`,
  'cycle.keep-feeding': () => 'The tank is ready but has no animals yet, so its bacteria need feeding: keep adding the daily ammonia dose your aquarist set until the first animals go in.',
  'dosing.lower': s => s.nitrite && `Nitrite is ${s.nitrite}${KIT}: so high that it slows the bacteria. Use smaller ammonia doses until nitrite comes down (the amounts are below).`,
})

/** Caution rules whose engine text a client reads as it is (no concentration, criterion or source in it). */
export const ALREADY_PLAIN: readonly string[] = ['testing.overdue', 'livestock.stocking-rate', 'readiness.soft-coral-young-tank']

/** Each value the finding's tests measured, the latest that has it (`readings` oldest first, as a finding lists them). */
export function latestMeasured(readings: readonly (MeasuredValues | undefined)[]): MeasuredValues {
  const out: MeasuredValues = {}
  for (const r of readings) {
    if (!r) continue
    for (const key of ['ammoniaN', 'nitriteN', 'nitrateN', 'pH', 'temperatureC', 'salinity'] as const) {
      const value = r[key]
      if (typeof value === 'number') out[key] = value
    }
  }
  return out
}

/** Practical salinity with the specific gravity a hydrometer at 25 °C would show, the number most clients know. */
function salinityWords(salinity: number): string {
  const inRange = salinity > 2 && salinity < 42
  return inRange ? `${formatNumber(salinity)} (about ${specificGravity(salinity, 25, 25).toFixed(3)} SG)` : formatNumber(salinity)
}

function said(measured: MeasuredValues, reader: Reader, severity: Severity): Said {
  const kit = reader.kit?.basis ?? { ammonia: 'N', nitrite: 'N', nitrate: 'N' }
  const n = (value: number | null | undefined) => (typeof value === 'number' ? value : undefined)
  const ammonia = n(measured.ammoniaN)
  const nitrite = n(measured.nitriteN)
  const temperature = n(measured.temperatureC)
  const pH = n(measured.pH)
  const salinity = n(measured.salinity)
  return {
    ammonia: ammonia === undefined ? undefined : kitReads(ammonia, kit.ammonia),
    nitrite: nitrite === undefined ? undefined : kitReads(nitrite, kit.nitrite),
    temperature: temperature === undefined ? undefined : reader.units === 'us' ? `${formatNumber(celsiusToFahrenheit(temperature))} °F` : `${formatNumber(temperature)} °C`,
    pH: pH === undefined ? undefined : formatNumber(pH),
    salinity: salinity === undefined ? undefined : salinityWords(salinity),
    danger: severity === 'danger',
  }
}

/** A finding as a client reads it: the plain sentence, and the engine's reason (in their units) as its "why". */
export interface ClientFinding {
  text: string
  /** The technical reason behind the sentence; null when the text already is the engine's own. */
  why: string | null
}

/** The finding in the client's words, from the values its tests measured; the engine's text restated when there is no sentence for it. */
export function findingForClient(finding: Pick<Finding, 'ruleId' | 'severity' | 'message'>, measured: MeasuredValues, reader: Reader): ClientFinding {
  const reason = forReader(finding.message, reader)
  const sentence = CLIENT_FINDING_WORDS[finding.ruleId]?.(said(measured, reader, finding.severity))
  return sentence ? { text: sentence, why: reason } : { text: reason, why: null }
}
