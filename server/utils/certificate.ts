/**
 * The sign-off certificate: one A4 page, set in Source Sans 3 (our own font, embedded
 * from @fontsource/source-sans-3's WOFF files via fontkit), naming the tank, client,
 * dates, method, final readings, supervisor, the livestock plan and a verification code.
 */
import fontkit from '@pdf-lib/fontkit'
import { PDFDocument, rgb, type PDFFont, type PDFPage } from 'pdf-lib'
import { formatDay } from '#shared/readings/reader-words'
import { celsiusToFahrenheit, litresToUsGallons } from '#shared/units'
import { datedAcclimation, stockingSteps, type FinalReadingKey, type FinalValue } from '#shared/sign-off/plan'
import type { SignedStage, SignOffAmendmentView, SignOffSnapshot } from '#shared/types/sign-off'
import type { CycleMethod, UnitSystem } from '#shared/vocabulary'
import { SIGNED_FIELD_LABELS } from '#server/domain/sign-off/signed-record'

export interface CertificateFacts {
  company: string
  tankName: string
  clientName: string
  siteLabel: string | null
  volumeLitres: number
  cycleMethod: CycleMethod
  cycleStartedAt: string | null
  requestedAt: string
  signedAt: string
  supervisorName: string
  aquaristName: string | null
  override: boolean
  decisionNote: string | null
  snapshot: SignOffSnapshot
  /** The latest value of each test in the input the decision was made from (finalReadings over sign_off_inputs). */
  finals: FinalValue[]
  /** The build plan as it stood at the decision. */
  stages: SignedStage[]
  /** Changes to the signed facts since, each with its reason. */
  amendments: SignOffAmendmentView[]
  verificationCode: string
  verifyUrl: string
  units: UnitSystem
}

const INK = rgb(0.07, 0.19, 0.23)
const SOFT = rgb(0.21, 0.32, 0.36)
const TIDE = rgb(0.06, 0.42, 0.45)
const DANGER = rgb(0.75, 0.22, 0.17)

/**
 * A date as "Dec 1, 2026" (the one day format of every screen), in UTC: a signed certificate
 * must read the same later, even if the company's time zone changes.
 */
export function certificateDate(iso: string | null | undefined): string {
  return iso ? formatDay(Date.parse(iso), 'UTC') : '—'
}

const READING_LABELS: Record<FinalReadingKey, string> = {
  ammoniaN: 'Total ammonia',
  nitriteN: 'Nitrite',
  nitrateN: 'Nitrate',
  pH: 'pH (NBS)',
  temperatureC: 'Temperature',
  salinity: 'Salinity (practical)',
  alkalinityDkh: 'Alkalinity',
  calciumMgL: 'Calcium',
  magnesiumMgL: 'Magnesium',
}

/** A final reading in words and the reader's units. */
export function formatFinalValue(key: FinalReadingKey, value: number, units: UnitSystem): string {
  switch (key) {
    case 'ammoniaN': case 'nitriteN': case 'nitrateN': return `${value.toFixed(2)} mg/L as N`
    case 'pH': return value.toFixed(2)
    case 'temperatureC': return units === 'us' ? `${celsiusToFahrenheit(value).toFixed(1)} °F` : `${value.toFixed(1)} °C`
    case 'salinity': return value.toFixed(1)
    case 'alkalinityDkh': return `${value.toFixed(1)} dKH`
    case 'calciumMgL': case 'magnesiumMgL': return `${Math.round(value)} mg/L`
  }
}

/** A changed value in a few words (dimensions as "1200 × 500 × 550 mm"). */
function describeValue(value: unknown): string {
  if (value === null || value === undefined) return '—'
  if (typeof value === 'number') return String(Math.round(value * 10) / 10)
  if (typeof value === 'object') return Object.values(value as Record<string, number>).join(' × ') + ' mm'
  return `"${String(value)}"`
}

function wrap(text: string, font: PDFFont, size: number, width: number): string[] {
  const lines: string[] = []
  for (const paragraph of text.split('\n')) {
    let line = ''
    for (const word of paragraph.split(/\s+/).filter(Boolean)) {
      const next = line ? `${line} ${word}` : word
      if (font.widthOfTextAtSize(next, size) > width && line) {
        lines.push(line)
        line = word
      }
      else line = next
    }
    lines.push(line)
  }
  return lines
}

class Writer {
  y: number
  constructor(private page: PDFPage, private regular: PDFFont, private bold: PDFFont, top: number, private left = 56, private width = 483) {
    this.y = top
  }

  text(value: string, opts: { size?: number, bold?: boolean, color?: ReturnType<typeof rgb>, gap?: number, x?: number, width?: number } = {}) {
    const size = opts.size ?? 10
    const font = opts.bold ? this.bold : this.regular
    for (const line of wrap(value, font, size, opts.width ?? this.width)) {
      this.page.drawText(line, { x: opts.x ?? this.left, y: this.y, size, font, color: opts.color ?? INK })
      this.y -= size * 1.3
    }
    this.y -= opts.gap ?? 0
  }

  /** Label and value side by side on one line. */
  pair(label: string, value: string, x = this.left, labelWidth = 110) {
    this.page.drawText(label, { x, y: this.y, size: 9, font: this.regular, color: SOFT })
    this.page.drawText(value, { x: x + labelWidth, y: this.y, size: 10, font: this.bold, color: INK })
  }

  heading(value: string) {
    this.y -= 6
    this.text(value, { size: 12, bold: true, color: TIDE, gap: 2 })
  }
}

/** The two faces of Source Sans 3 the certificate is set in (server/utils/certificate-fonts.ts loads them). */
export interface CertificateFonts {
  regular: Uint8Array
  bold: Uint8Array
}

/**
 * Renders the certificate; returns the PDF bytes. Framework-free, so the heavy-work pool
 * runs it off the request loop (server/workers/certificate.ts).
 */
export async function renderCertificate(facts: CertificateFacts, fonts: CertificateFonts): Promise<Uint8Array> {
  const doc = await PDFDocument.create()
  doc.registerFontkit(fontkit)
  const regular = await doc.embedFont(fonts.regular, { subset: true })
  const bold = await doc.embedFont(fonts.bold, { subset: true })
  doc.setTitle(`Cycle sign-off certificate — ${facts.tankName}`)
  doc.setAuthor(facts.company)
  doc.setCreator('Tidewright')
  doc.setProducer('Tidewright')
  doc.setCreationDate(new Date(facts.signedAt))
  doc.setModificationDate(new Date(facts.signedAt))
  const page = doc.addPage([595.28, 841.89])
  page.drawRectangle({ x: 0, y: 800, width: 595.28, height: 41.89, color: TIDE })
  page.drawText('Tidewright', { x: 56, y: 814, size: 14, font: bold, color: rgb(1, 1, 1) })
  page.drawText(facts.company, { x: 539 - regular.widthOfTextAtSize(facts.company, 10), y: 816, size: 10, font: regular, color: rgb(1, 1, 1) })

  const w = new Writer(page, regular, bold, 760)
  w.text('Cycle sign-off certificate', { size: 22, bold: true, gap: 2 })
  w.text(`The nitrogen cycle of this aquarium was reviewed and signed off by ${facts.supervisorName} on ${certificateDate(facts.signedAt)}.`, { size: 11, color: SOFT, gap: 8 })

  const volume = facts.units === 'us' ? `${Math.round(litresToUsGallons(facts.volumeLitres))} US gal` : `${Math.round(facts.volumeLitres)} L`
  const left: [string, string][] = [
    ['Tank', facts.tankName],
    ['Client', facts.clientName],
    ['Site', facts.siteLabel ?? '—'],
    ['Volume', volume],
    ['Method', facts.cycleMethod === 'fish-in' ? 'Fish-in cycle' : 'Fishless cycle'],
  ]
  const verdict = facts.snapshot.verdict
  const right: [string, string][] = [
    ['Cycle started', certificateDate(facts.cycleStartedAt)],
    ['Cycle complete', certificateDate(verdict.completedOn)],
    ['Sign-off asked', certificateDate(facts.requestedAt)],
    ['Signed off', certificateDate(facts.signedAt)],
    ['Supervisor', facts.supervisorName],
  ]
  const top = w.y
  left.forEach(([l, v], i) => { w.y = top - i * 15; w.pair(l, v, 56, 60) })
  right.forEach(([l, v], i) => { w.y = top - i * 15; w.pair(l, v, 310, 90) })
  w.y = top - left.length * 15 - 2
  if (facts.aquaristName) w.text(`Commissioned by ${facts.aquaristName}. Engine rule set ${verdict.ruleSetVersion}; phase at sign-off: ${verdict.phase}.`, { size: 9, color: SOFT })
  else w.text(`Engine rule set ${verdict.ruleSetVersion}; phase at sign-off: ${verdict.phase}.`, { size: 9, color: SOFT })

  const finished = facts.stages.filter(stage => stage.status === 'done' || stage.status === 'skipped')
  if (facts.stages.length) w.text(`Build plan at sign-off: ${finished.length} of ${facts.stages.length} stages finished (${finished.map(stage => stage.status === 'skipped' ? `${stage.title}, skipped` : stage.title).join('; ')}).`, { size: 9, color: SOFT })

  if (facts.amendments.length) {
    w.heading('Amended after signing')
    for (const amendment of facts.amendments) {
      const changes = amendment.changes.map(c => `${(SIGNED_FIELD_LABELS as Record<string, string>)[c.field] ?? c.field} ${describeValue(c.before)} changed to ${describeValue(c.after)}`).join('; ')
      w.text(`${certificateDate(amendment.at)}, ${amendment.byName ?? 'a former user'}: ${changes}. Reason: ${amendment.reason}`, { size: 9.5 })
    }
  }

  if (facts.override) {
    w.heading('Signed against the engine\'s verdict')
    w.text(`The supervisor signed this tank off although the rule engine did not judge it ready: ${facts.snapshot.overrideGrounds.join(' ')}`, { size: 9.5, color: DANGER })
    w.text(`Reason given: ${facts.decisionNote ?? ''}`, { size: 9.5, bold: true, color: DANGER })
  }

  w.heading('Final tests')
  const finals = facts.finals
  if (!finals.length) w.text('No tests recorded.', { size: 10 })
  const rowTop = w.y
  finals.forEach((f, i) => {
    const col = i % 2
    w.y = rowTop - Math.floor(i / 2) * 14
    w.pair(READING_LABELS[f.key], `${formatFinalValue(f.key, f.value, facts.units)}  (${certificateDate(f.takenAt)})`, col === 0 ? 56 : 310, 80)
  })
  w.y = rowTop - Math.ceil(finals.length / 2) * 14

  w.heading('Livestock plan for the first weeks')
  w.text('Add livestock in this order, a few animals at a time, testing ammonia and nitrite a day after each addition. A group may go in from the date shown once nothing blocks it.', { size: 9, color: SOFT, gap: 2 })
  for (const step of stockingSteps(verdict)) {
    const when = step.allowed ? `from ${certificateDate(step.earliest ?? facts.signedAt)}` : step.earliest ? `not before ${certificateDate(step.earliest)}` : 'not yet'
    w.text(`${step.order}. ${step.label} — ${when}${step.blockers.length && !step.allowed ? `: ${step.blockers.join(' ')}` : ''}`, { size: 9.5 })
  }
  // The tank's own acclimation as it stood when signed (older records: the defaults they were printed with).
  const lighting = datedAcclimation(facts.signedAt, facts.snapshot.acclimation)
  const first = lighting[0]!
  const last = lighting.at(-1)!
  w.text(`Lighting: hold the plateau at ${first.plateauPercent} % from ${certificateDate(first.from)} and raise it weekly to ${last.plateauPercent} % by ${certificateDate(last.from)} (${lighting.map(l => `${l.plateauPercent} %`).join(', ')}).`, { size: 9.5, gap: 2 })
  w.text('Caution: animal welfare comes first. Acclimate every animal to the tank\'s temperature and salinity, and ask a qualified aquarist if anything looks wrong.', { size: 8.5, color: SOFT })

  // Verification box at the bottom of the page.
  page.drawRectangle({ x: 56, y: 56, width: 483, height: 64, borderColor: TIDE, borderWidth: 1 })
  page.drawText('Verification code', { x: 68, y: 102, size: 9, font: regular, color: SOFT })
  page.drawText(facts.verificationCode, { x: 68, y: 84, size: 14, font: bold, color: INK })
  page.drawText(`Check this certificate against the record at ${facts.verifyUrl}`, { x: 68, y: 66, size: 8.5, font: regular, color: SOFT })
  return doc.save({ useObjectStreams: false })
}
