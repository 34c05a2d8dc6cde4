/**
 * The page of tests and events a supervisor reviews, as the JSON text the evidence answer
 * sends. Made in the heavy-work pool (server/workers/evidence-page.ts): on a tank with an
 * imported log, reading a thousand tests and turning them into text held the request loop,
 * which serves every company, longer than anything else the tank's pages asked of it.
 *
 * Framework-free: takes a `Db`.
 */
import { EVIDENCE_PAGE_SIZE } from '#shared/readings/limits'
import type { Evidence, EvidenceEvent, EvidenceReading } from '#shared/types/sign-off'
import type { Db } from '#server/db/connection'
import { events, readings } from '#server/db/schema'
import { eventHistoryPage, readingHistoryPage, type EventPageRow, type ReadingPageRow } from '#server/domain/readings/current'

/** A page of the evidence's tests and events, each list as its JSON text. */
export interface EvidencePageText {
  readingsTotal: number
  eventsTotal: number
  /** `Evidence['readings']` as JSON. */
  readings: string
  /** `Evidence['events']` as JSON. */
  events: string
}

function toEvidenceReading(r: ReadingPageRow): EvidenceReading {
  return {
    id: r.id,
    takenAt: r.takenAt,
    enteredByName: r.enteredByName,
    ammoniaN: r.ammoniaN,
    nitriteN: r.nitriteN,
    nitrateN: r.nitrateN,
    pH: r.pH,
    temperatureC: r.temperatureC,
    salinity: r.salinity,
    alkalinityDkh: r.alkalinityDkh,
    calciumMgL: r.calciumMgL,
    magnesiumMgL: r.magnesiumMgL,
    phosphateMgL: r.phosphateMgL,
    notes: r.notes,
    correctsId: r.correctsId,
    correctionReason: r.correctionReason,
    correctedById: r.replacedBy?.id ?? null,
    createdAt: r.createdAt,
  }
}

function toEvidenceEvent(e: EventPageRow): EvidenceEvent {
  return {
    id: e.id,
    at: e.at,
    kind: e.kind,
    amount: e.amount,
    group: e.group,
    notes: e.notes,
    enteredByName: e.enteredByName,
    correctsId: e.correctsId,
    correctionReason: e.correctionReason,
    correctedById: e.replacedBy?.id ?? null,
  }
}

/** Page `page` of a tank's tests and events (page 1: the newest EVIDENCE_PAGE_SIZE of each, oldest first), every row with its trail. */
export function evidencePageText(db: Db, tankId: string, page: number): EvidencePageText {
  // Every row with its trail: the supervisor sees what was corrected, by whom and why.
  const readingPage = readingHistoryPage(db, tankId, {}, { sort: readings.takenAt, dir: 'desc', page, pageSize: EVIDENCE_PAGE_SIZE })
  const eventPage = eventHistoryPage(db, tankId, {}, { sort: events.at, dir: 'desc', page, pageSize: EVIDENCE_PAGE_SIZE })
  return {
    readingsTotal: readingPage.total,
    eventsTotal: eventPage.total,
    readings: JSON.stringify(readingPage.rows.reverse().map(toEvidenceReading)),
    events: JSON.stringify(eventPage.rows.reverse().map(toEvidenceEvent)),
  }
}

/** The evidence but its two lists, in the answer's order: the fields before the lists, and after them. */
export type EvidenceHead = Pick<Evidence, 'tank' | 'verdict' | 'evaluatedAt' | 'overrideGrounds' | 'page' | 'pageSize' | 'readingsTotal' | 'eventsTotal'>
export type EvidenceTail = Omit<Evidence, keyof EvidenceHead | 'readings' | 'events'>

/**
 * The whole answer's JSON text, the page's lists placed as they came: the same text as
 * JSON.stringify of the Evidence with its fields in this order, without turning the lists into
 * objects and back on the request loop.
 */
export function evidenceText(head: EvidenceHead, page: EvidencePageText, tail: EvidenceTail): string {
  return `${JSON.stringify(head).slice(0, -1)},"readings":${page.readings},"events":${page.events},${JSON.stringify(tail).slice(1)}`
}
