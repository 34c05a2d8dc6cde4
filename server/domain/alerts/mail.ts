/**
 * The words of alert notices and e-mails: what was measured, what it means, what to do,
 * and a link to the tank. Pure functions over plain rows.
 */
import { fromNitrogen } from '../../../shared/chemistry/nitrogen'
import { formatNumber, formatPercent } from '../../../shared/cycle/words'
import type { CycleAction, Finding } from '../../../shared/cycle/types'
import { nitrogenToKit, type CanonicalValues, type KitBasisChoice } from '../../../shared/readings/entry'
import { findingForClient, type ClientFinding } from '../../../shared/readings/finding-words'
import { formatMoment, forReader, type Reader } from '../../../shared/readings/reader-words'
import { celsiusToFahrenheit } from '../../../shared/units'
import type { UnitSystem } from '../../../shared/vocabulary'

/** The reading an alert mail quotes: when it was taken and the values a danger is judged on (canonical units). */
export type MeasuredReading = { takenAt: string } & Pick<CanonicalValues, 'ammoniaN' | 'nitriteN' | 'nitrateN' | 'pH' | 'temperatureC' | 'salinity'>

export interface AlertMailInput {
  tankName: string
  tankUrl: string
  finding: Pick<Finding, 'message' | 'ruleId'>
  actions: readonly CycleAction[]
  reading: MeasuredReading | null
  units: UnitSystem
  /** The company's time zone: every moment in the mail reads on its clock. */
  timeZone: string
}

export interface MailWords {
  subject: string
  text: string
  html: string
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)
}

/** The values of a reading, one short phrase each, in the reader's units. */
export function measuredLines(reading: MeasuredReading | null, units: UnitSystem): string[] {
  if (!reading) return []
  const lines: string[] = []
  if (reading.ammoniaN !== null) lines.push(`Total ammonia ${formatNumber(reading.ammoniaN)} mg/L as N (${formatNumber(fromNitrogen(reading.ammoniaN, 'NH3'))} ppm as NH3)`)
  if (reading.nitriteN !== null) lines.push(`Nitrite ${formatNumber(reading.nitriteN)} mg/L as N (${formatNumber(fromNitrogen(reading.nitriteN, 'NO2'))} ppm as NO2)`)
  if (reading.nitrateN !== null) lines.push(`Nitrate ${formatNumber(reading.nitrateN)} mg/L as N`)
  if (reading.pH !== null) lines.push(`pH ${formatNumber(reading.pH)}`)
  if (reading.temperatureC !== null) {
    lines.push(units === 'us' ? `Temperature ${formatNumber(celsiusToFahrenheit(reading.temperatureC))} °F` : `Temperature ${formatNumber(reading.temperatureC)} °C`)
  }
  if (reading.salinity !== null) lines.push(`Salinity ${formatNumber(reading.salinity)} (practical)`)
  return lines
}

const kitLabel = (basis: string) => (basis === 'N' ? 'as N' : `as ${basis}`)

/** The values of a reading as the client's own kits read them (ppm as NH3, NO2, NO3 or as N). */
export function kitMeasuredLines(reading: MeasuredReading | null, kit: KitBasisChoice, units: UnitSystem): string[] {
  if (!reading) return []
  const lines: string[] = []
  if (reading.ammoniaN !== null) lines.push(`Ammonia ${formatNumber(nitrogenToKit(reading.ammoniaN, kit.ammonia))} ppm ${kitLabel(kit.ammonia)}`)
  if (reading.nitriteN !== null) lines.push(`Nitrite ${formatNumber(nitrogenToKit(reading.nitriteN, kit.nitrite))} ppm ${kitLabel(kit.nitrite)}`)
  if (reading.nitrateN !== null) lines.push(`Nitrate ${formatNumber(nitrogenToKit(reading.nitrateN, kit.nitrate))} ppm ${kitLabel(kit.nitrate)}`)
  return [...lines, ...measuredLines({ ...reading, ammoniaN: null, nitriteN: null, nitrateN: null }, units)]
}

/** The suggested actions, the water change first with its percentage. */
export function actionLines(actions: readonly CycleAction[]): string[] {
  return actions.slice(0, 3).map((a) => {
    if (a.kind !== 'water-change' || a.waterChangePercent === undefined) return a.message
    const percent = formatPercent(a.waterChangePercent)
    return a.message.includes(percent) ? a.message : `${a.message} (change about ${percent} of the water)`
  })
}

/** The reader of a mail: their units, the company's clock and, for a client, their kits. */
export function mailReader(input: Pick<AlertMailInput, 'units' | 'timeZone' | 'reading'>, kitBasis?: KitBasisChoice): Reader {
  const exactN = [input.reading?.ammoniaN, input.reading?.nitriteN, input.reading?.nitrateN]
  return { units: input.units, when: ms => formatMoment(ms, input.timeZone), kit: kitBasis ? { basis: kitBasis, exactN } : undefined }
}

/**
 * A danger finding as the tank's client reads it: the plain sentence for its rule, and the
 * engine's reason as the "why" (`shared/readings/finding-words.ts`). Alerts are dangers.
 */
export function clientMeaning(finding: Pick<Finding, 'message' | 'ruleId'>, reading: MeasuredReading | null, reader: Reader): ClientFinding {
  return findingForClient({ ...finding, severity: 'danger' }, reading ?? {}, reader)
}

/** The in-app notice to the tank's client: the plain sentence and the first thing to do, in their units. */
export function clientNoticeBody(finding: Pick<Finding, 'message' | 'ruleId'>, actions: readonly CycleAction[], reading: MeasuredReading | null, reader: Reader): string {
  return [clientMeaning(finding, reading, reader).text, ...actionLines(actions).slice(0, 1).map(a => forReader(a, reader))].join(' ')
}

function compose(subject: string, intro: string, input: AlertMailInput, closing: string, measured = measuredLines(input.reading, input.units), reader = mailReader(input), meaning?: ClientFinding): MailWords {
  const words = (message: string) => forReader(message, reader)
  const todo = actionLines(input.actions).map(words)
  const sections: [string, string[]][] = [
    [input.reading ? `What was measured (test of ${reader.when(Date.parse(input.reading.takenAt))})` : 'What was measured', measured.length ? measured : ['See the tank page for the test results.']],
    ['What it means', [meaning?.text ?? words(input.finding.message)]],
    ['What to do', todo.length ? todo : ['Look at the tank\'s verdict and decide what to do.']],
    ...(meaning?.why ? [['Why', [meaning.why]] as [string, string[]]] : []),
  ]
  const text = [intro, '', ...sections.flatMap(([title, lines]) => [`${title}:`, ...lines.map(l => `- ${l}`), '']),
    `Open the tank: ${input.tankUrl}`, '', closing, '', 'Tidewright. Where animals are at risk, an experienced aquarist has the final word.'].join('\n')
  const html = [`<p>${escapeHtml(intro)}</p>`,
    ...sections.map(([title, lines]) => `<h3>${escapeHtml(title)}</h3><ul>${lines.map(l => `<li>${escapeHtml(l)}</li>`).join('')}</ul>`),
    `<p><a href="${escapeHtml(input.tankUrl)}">Open ${escapeHtml(input.tankName)} in Tidewright</a></p>`,
    `<p>${escapeHtml(closing)}</p>`].join('\n')
  return { subject, text, html }
}

/** The e-mail to the assigned aquarist when an alert opens. */
export function alertOpenedMail(input: AlertMailInput): MailWords {
  return compose(`Danger on ${input.tankName}: act now`, `A new test on ${input.tankName} crossed a danger threshold.`, input,
    'Acknowledge the alert in Tidewright once you are on it; unacknowledged alerts go to the tank\'s supervisor.')
}

/** The e-mail to the supervisor when nobody acknowledged the alert in time. */
export function alertEscalatedMail(input: AlertMailInput & { minutes: number, aquaristName: string | null }): MailWords {
  return compose(`Unanswered danger alert on ${input.tankName}`,
    `The danger alert on ${input.tankName} has not been acknowledged for ${input.minutes} minutes${input.aquaristName ? ` by ${input.aquaristName}` : ''}.`, input,
    'Please make sure someone acts on it.')
}

/** The e-mail to the tank's own client: the same facts in their kit's units, plain words and instructions, and the reason last. */
export function clientDangerMail(input: AlertMailInput & { kitBasis: KitBasisChoice }): MailWords {
  const reader = mailReader(input, input.kitBasis)
  return compose(`Your tank ${input.tankName} needs you now`,
    `Your latest test on ${input.tankName} shows a danger to the animals. Please do the first step below as soon as you can.`, input,
    'Your aquarist has been told too. After a water change, match the new water\'s temperature and salinity to the tank, test again and enter the result in Tidewright. If anything looks wrong, call your aquarist.',
    kitMeasuredLines(input.reading, input.kitBasis, input.units), reader, clientMeaning(input.finding, input.reading, reader))
}

/** Plain words for an HTML body. */
export function plainHtml(paragraphs: readonly string[], link?: { href: string, label: string }): string {
  return [...paragraphs.map(p => `<p>${escapeHtml(p)}</p>`), ...(link ? [`<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>`] : [])].join('\n')
}
