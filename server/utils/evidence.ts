/** The evidence a supervisor reviews: read straight from the tables, shaped for the API. */
import { asc, eq } from 'drizzle-orm'
import type { Evidence } from '#shared/types/sign-off'
import { alerts, planStages, uploads } from '#server/db/schema'
import { tankEvents, tankReadings } from '#server/domain/readings/current'
import type { Actor } from './access'
import { evaluateNow, maySignOff, pendingRequest, signOffHistory, toSignOffRecordWithSnapshot, unresolvedAlertCount, userNames } from './sign-offs'
import { overrideGrounds } from '#shared/sign-off/plan'
import { currentApprovedSignOff } from './sign-off-lock'
import { getTankView } from './tank-views'

/** The whole cycle of one tank, or undefined when the actor may not see it. */
export function tankEvidence(actor: Actor, tankId: string, now = new Date()): Evidence | undefined {
  const tank = getTankView(actor, tankId)
  if (!tank) return undefined
  const db = useDB()
  const names = userNames(actor.organisationId)
  const name = (id: string | null) => (id ? names.get(id) ?? null : null)
  const { verdict } = evaluateNow(tankId, now)
  // Every row with its trail: the supervisor sees what was corrected, by whom and why.
  const readingRows = tankReadings(db, tankId, { which: 'all' })
  const eventRows = tankEvents(db, tankId, { which: 'all' })
  const stageRows = db.select().from(planStages).where(eq(planStages.tankId, tankId)).orderBy(asc(planStages.position)).all()
  const uploadRows = db.select().from(uploads).where(eq(uploads.tankId, tankId)).orderBy(asc(uploads.createdAt)).all()
  const alertRows = db.select().from(alerts).where(eq(alerts.tankId, tankId)).orderBy(asc(alerts.openedAt)).all()
  const tankRow = { organisationId: actor.organisationId, supervisorId: tank.supervisorId }
  return {
    tank,
    verdict,
    evaluatedAt: now.toISOString(),
    overrideGrounds: overrideGrounds(verdict, unresolvedAlertCount(tankId)),
    readings: readingRows.map(r => ({
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
    })),
    events: eventRows.map(e => ({
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
    })),
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
    lockedUntil: currentApprovedSignOff(tankId)?.decidedAt ?? null,
    canDecide: maySignOff(actor, tankRow) && !!pendingRequest(tankId),
    canReopen: maySignOff(actor, tankRow) && !!currentApprovedSignOff(tankId),
  }
}
