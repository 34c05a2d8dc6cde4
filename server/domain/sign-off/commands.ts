/**
 * The sign-off commands, framework-free: ask for sign-off, approve or return, reopen, and
 * the move to stocking that livestock after a sign-off causes. Each takes a `Db`, writes its
 * rows, the tank's status (through changeTankStatus) and its audit row in one transaction,
 * and refuses with SignOffRefused (or TankStatusRefused from the lifecycle).
 */
import { and, eq, getTableColumns, ne, sql } from 'drizzle-orm'
import { acclimationSettingsOf, overrideGrounds } from '#shared/sign-off/plan'
import { OVERRIDE_REASON_MESSAGE } from '#shared/schemas/sign-off'
import type { SignOffSnapshot } from '#shared/types/sign-off'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import { events, planStages, signOffs, tanks, users } from '#server/db/schema'
import { recordAudit } from '#server/domain/audit/record'
import { changeTankStatus } from '#server/domain/tanks/status'
import { currentApprovedSignOff, maySignOff, newVerificationCode, pendingRequest, selfApprovalAllowed, unresolvedAlertCount, type SignOffActor, type SignOffRow, type TankRow } from './records'
import { assertEvaluationCurrent, type SignOffEvaluation, type SignOffVerdict } from './evaluation'
import { conflict, SignOffRefused } from './refusal'
import { lockedUntil } from './lock'
import { captureSignedFacts, recordSignedInput } from './signed-record'

/** The shortest note that counts as a written reason. */
const REASON_MIN_LENGTH = 3

/**
 * What must hold before a sign-off may be asked for, checked before the engine runs (the glue
 * evaluates only a request that may go ahead) and again by the command.
 */
export function checkSignOffRequest(db: Db, tank: TankRow, mayManage: boolean): void {
  if (!mayManage) throw new SignOffRefused(403, 'Only the company\'s aquarists and admins may ask for sign-off')
  if (tank.status !== 'cycling' && tank.status !== 'cycled') conflict(`A tank that is ${tank.status} cannot be put up for sign-off`)
  if (pendingRequest(db, tank.id)) conflict('A sign-off request is already waiting for the supervisor')
}

/**
 * Asks for sign-off of a cycle the engine judges complete; the tank becomes 'cycled'.
 * `mayManage`: whether the actor may change this tank (server/utils/access.ts decides).
 * `evaluation`: the tank evaluated as of the request (evaluation.ts); refused (EvaluationOutdated)
 * when the tank's data or what else the engine read (its profile, the company's thresholds)
 * changed after it was made.
 */
export function requestSignOff(db: Db, actor: SignOffActor, tank: TankRow, note: string, mayManage: boolean, evaluation: SignOffVerdict): SignOffRow {
  checkSignOffRequest(db, tank, mayManage)
  if (evaluation.verdict.phase !== 'complete') conflict('The engine does not judge this cycle complete yet; keep testing until it does')
  const at = evaluation.now
  // Immediate: it reads the tank's data revision, then writes; no other connection writes in between.
  return db.transaction((tx) => {
    assertEvaluationCurrent(tx, tank.id, evaluation)
    const row = tx.insert(signOffs).values({
      organisationId: tank.organisationId, tankId: tank.id, requestedBy: actor.id, requestedAt: at, requestNote: note || null, status: 'requested',
    }).returning().get()
    changeTankStatus(tx, { tankId: tank.id, trigger: 'sign-off-requested', actor })
    recordAudit(tx, actor, { action: 'sign-off.request', entity: 'sign_off', entityId: row.id, before: { tankStatus: tank.status }, after: { tankId: tank.id, note: row.requestNote, tankStatus: 'cycled' } })
    return row
  }, { behavior: 'immediate' })
}

/** A sign-off's columns but its snapshot: a decision has its snapshot in hand and does not read it back. */
const { snapshot: _snapshot, ...decidedColumns } = getTableColumns(signOffs)

export interface DecisionResult {
  signOff: SignOffRow
  verificationCode: string | null
}

/** Four eyes: whoever asked does not approve, unless the company allows it and a reason is written. */
function checkSelfApproval(db: Db, actor: SignOffActor, tank: TankRow, request: SignOffRow, note: string): void {
  if (request.requestedBy !== actor.id) return
  if (!selfApprovalAllowed(db, tank.organisationId)) throw new SignOffRefused(403, 'You asked for this sign-off; another supervisor or an admin must approve it')
  if (note.length < REASON_MIN_LENGTH) throw new SignOffRefused(400, 'You asked for this sign-off yourself: write why you approve it without a second person.', { field: 'note' })
}

/**
 * What must hold before a decision may be made, checked before the engine runs (the glue
 * evaluates only a decision that may go ahead) and again by the command: the waiting request.
 */
export function checkSignOffDecision(db: Db, actor: SignOffActor, tank: TankRow, decision: 'approve' | 'return', note: string): SignOffRow {
  if (!maySignOff(actor, tank)) throw new SignOffRefused(403, 'Only this tank\'s supervisor or an admin may decide')
  const request = pendingRequest(db, tank.id)
  if (!request) conflict('No sign-off request is waiting for this tank')
  if (decision === 'approve') checkSelfApproval(db, actor, tank, request, note)
  return request
}

/**
 * Approves or returns the waiting request. The engine input and verdict of `evaluation` (the tank
 * evaluated as of the decision, evaluation.ts) are stored with it, the input in sign_off_inputs and
 * the verdict in the snapshot; the answer holds no input. Approving against the verdict
 * needs a written reason (400). Refused (EvaluationOutdated) when the tank's data, profile or
 * thresholds changed after the evaluation was made: a decision never rests on a verdict that
 * leaves out a test or was made under settings no longer in force.
 */
export function decideSignOff(db: Db, actor: SignOffActor, tank: TankRow, decision: 'approve' | 'return', note: string, evaluation: SignOffEvaluation): DecisionResult {
  const request = checkSignOffDecision(db, actor, tank, decision, note)
  const { input, verdict } = evaluation
  const unresolvedAlerts = unresolvedAlertCount(db, tank.id)
  const grounds = overrideGrounds(verdict, unresolvedAlerts)
  const override = decision === 'approve' && grounds.length > 0
  if (override && note.length < REASON_MIN_LENGTH) throw new SignOffRefused(400, OVERRIDE_REASON_MESSAGE, { field: 'note', data: { overrideGrounds: grounds } })
  // The tank's facts and stages are kept with the decision: the certificate prints them, never the live tank.
  const facts = captureSignedFacts(db, tank.id, actor.id)
  // The tank's own lighting acclimation, kept with the decision so the plan stays as signed.
  const acclimation = acclimationSettingsOf(db.select({ key: planStages.key, data: planStages.data }).from(planStages).where(eq(planStages.tankId, tank.id)).all())
  // The input is kept beside the snapshot (sign_off_inputs, with the ids it holds for the lock): reads of the decision never parse it.
  const snapshot: SignOffSnapshot = { facts, verdict, overrideGrounds: decision === 'approve' ? grounds : [], unresolvedAlerts, acclimation }
  const at = input.now
  const code = decision === 'approve' ? newVerificationCode() : null
  // Immediate: it reads the tank's data revision, then writes; no other connection writes in between.
  const row = db.transaction((tx) => {
    assertEvaluationCurrent(tx, tank.id, evaluation)
    const updated = tx.update(signOffs).set({
      status: decision === 'approve' ? 'approved' : 'returned',
      decidedBy: actor.id,
      decidedAt: at,
      decisionNote: note || null,
      override,
      snapshot,
      ruleSetVersion: verdict.ruleSetVersion,
      verificationCode: code,
    }).where(and(eq(signOffs.id, request.id), eq(signOffs.status, 'requested'))).returning(decidedColumns).get()
    if (!updated) conflict('This request was decided a moment ago')
    recordSignedInput(tx, request.id, input)
    const moved = changeTankStatus(tx, { tankId: tank.id, trigger: decision === 'approve' ? 'sign-off-approved' : 'sign-off-returned', actor })
    recordAudit(tx, actor, {
      action: decision === 'approve' ? (override ? 'sign-off.approve-override' : 'sign-off.approve') : 'sign-off.return',
      entity: 'sign_off',
      entityId: request.id,
      before: { status: 'requested', tankStatus: tank.status },
      after: { status: updated.status, tankStatus: moved.status, note: updated.decisionNote, override, overrideGrounds: snapshot.overrideGrounds, phase: verdict.phase, ruleSetVersion: verdict.ruleSetVersion },
    })
    return { ...updated, snapshot }
  }, { behavior: 'immediate' })
  return { signOff: row, verificationCode: code }
}

/** Reopens the current approved sign-off with a reason; the record unlocks and the tank goes back to cycling. */
export function reopenSignOff(db: Db, actor: SignOffActor, tank: TankRow, reason: string, now = new Date()): SignOffRow {
  if (!maySignOff(actor, tank)) throw new SignOffRefused(403, 'Only this tank\'s supervisor or an admin may reopen a sign-off')
  const current = currentApprovedSignOff(db, tank.id)
  if (!current) conflict('This tank has no sign-off to reopen')
  const at = now.toISOString()
  return db.transaction((tx) => {
    const row = tx.update(signOffs).set({ status: 'reopened', reopenedBy: actor.id, reopenedAt: at, reopenReason: reason })
      .where(and(eq(signOffs.id, current.id), eq(signOffs.status, 'approved'))).returning().get()
    if (!row) conflict('This sign-off was reopened a moment ago')
    changeTankStatus(tx, { tankId: tank.id, trigger: 'sign-off-reopened', actor })
    recordAudit(tx, actor, { action: 'sign-off.reopen', entity: 'sign_off', entityId: row.id, before: { status: 'approved', tankStatus: tank.status }, after: { status: 'reopened', reason, tankStatus: 'cycling' } })
    return row
  })
}

/** Asked after every save (most tanks are not signed off and stop there): prepared once. */
const tankStatus = preparedPerDb(db => db.select({ status: tanks.status }).from(tanks).where(eq(tanks.id, sql.placeholder('tankId'))).prepare())

/**
 * After a change to a signed-off tank: livestock logged by staff after the sign-off means
 * stocking has begun. A client's livestock event is recorded (the engine sees it) but
 * does not move the tank's status: only staff start stocking.
 */
export function advanceToStockingIfLivestock(db: Db, tankId: string): void {
  const tank = tankStatus(db).get({ tankId })
  if (tank?.status !== 'signed-off') return
  const decidedAt = lockedUntil(db, tankId)
  if (!decidedAt) return
  const livestock = db.select({ id: events.id }).from(events)
    .innerJoin(users, eq(users.id, events.enteredBy))
    .where(and(eq(events.tankId, tankId), eq(events.kind, 'livestock-added'), ne(users.role, 'client'), sql`${events.at} > ${decidedAt}`)).get()
  if (livestock) changeTankStatus(db, { tankId, trigger: 'livestock-logged', actor: null })
}
