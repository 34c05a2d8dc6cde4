/**
 * The evidence a supervisor reviews: read straight from the tables, shaped for the API.
 * Readings and events come a page of EVIDENCE_PAGE_SIZE at a time (page 1: the newest,
 * oldest first within the page), so a tank with years of imported tests answers in
 * bounded size and time; the full record is the CSV export.
 */
import { asc, eq } from 'drizzle-orm'
import { EVIDENCE_PAGE_SIZE } from '#shared/readings/limits'
import { alerts, planStages, uploads } from '#server/db/schema'
import { evidenceText, type EvidenceHead, type EvidenceTail } from '#server/domain/sign-off/evidence-page'
import type { Actor } from './access'
import { maySignOff, pendingRequest, signOffHistory, toSignOffRecordWithSnapshot, unresolvedAlertCount, userNames } from './sign-offs'
import { overrideGrounds } from '#shared/sign-off/plan'
import { lockedUntil } from './sign-off-lock'
import { getTankView } from './tank-views'

/**
 * The whole cycle of one tank (a page of its readings and events) as the JSON text of its
 * Evidence, or undefined when the actor may not see it. The page's tests and events come from
 * the heavy-work pool already as text (evidence-page.ts); the rest is read here.
 */
export async function tankEvidence(actor: Actor, tankId: string, now = new Date(), page = 1): Promise<string | undefined> {
  const tank = await getTankView(actor, tankId)
  if (!tank) return undefined
  const db = useDB()
  // Over years of imported tests the engine takes a while, and a page of a thousand tests is the
  // longest piece of the answer: both are made in the heavy-work pool.
  const [evaluation, pageText] = await Promise.all([evaluateOffLoop(tankId, now), evidencePageOffLoop(tankId, page)])
  const verdict = evaluation?.verdict
  if (!verdict) return undefined
  const names = userNames(actor.organisationId)
  const name = (id: string | null) => (id ? names.get(id) ?? null : null)
  const stageRows = db.select().from(planStages).where(eq(planStages.tankId, tankId)).orderBy(asc(planStages.position)).all()
  const uploadRows = db.select().from(uploads).where(eq(uploads.tankId, tankId)).orderBy(asc(uploads.createdAt)).all()
  const alertRows = db.select().from(alerts).where(eq(alerts.tankId, tankId)).orderBy(asc(alerts.openedAt)).all()
  const tankRow = { organisationId: actor.organisationId, supervisorId: tank.supervisorId }
  // The approval's decision time only, asked once: the lock and the reopen button need no more of it.
  const signedUntil = lockedUntil(tankId)
  const head: EvidenceHead = {
    tank,
    verdict,
    evaluatedAt: now.toISOString(),
    overrideGrounds: overrideGrounds(verdict, unresolvedAlertCount(tankId)),
    page,
    pageSize: EVIDENCE_PAGE_SIZE,
    readingsTotal: pageText.readingsTotal,
    eventsTotal: pageText.eventsTotal,
  }
  const tail: EvidenceTail = {
    stages: stageRows.map(s => ({
      id: s.id,
      position: s.position,
      key: s.key,
      title: s.title,
      status: s.status,
      skipReason: s.skipReason,
      notes: s.notes,
      checklist: s.checklist.map(item => ({ id: item.id, label: item.label, done: item.done, doneByName: name(item.doneBy ?? null), doneAt: item.doneAt ?? null })),
      completedByName: name(s.completedBy),
      completedAt: s.completedAt,
    })),
    uploads: uploadRows.map(u => ({
      id: u.id,
      stageId: u.stageId,
      readingId: u.readingId,
      mimeType: u.mimeType,
      sizeBytes: u.sizeBytes,
      originalName: u.originalName,
      hasThumbnail: !!u.thumbnailKey,
      uploadedByName: name(u.uploadedBy),
      createdAt: u.createdAt,
    })),
    alerts: alertRows.map(a => ({
      id: a.id,
      kind: a.kind,
      status: a.status,
      message: a.message,
      openedAt: a.openedAt,
      acknowledgedAt: a.acknowledgedAt,
      acknowledgeNote: a.acknowledgeNote,
      resolvedAt: a.resolvedAt,
      resolveNote: a.resolveNote,
    })),
    signOffs: signOffHistory(tankId).map(r => toSignOffRecordWithSnapshot(r, names)),
    lockedUntil: signedUntil,
    canDecide: maySignOff(actor, tankRow) && !!pendingRequest(tankId),
    canReopen: maySignOff(actor, tankRow) && signedUntil !== null,
  }
  return evidenceText(head, pageText, tail)
}
