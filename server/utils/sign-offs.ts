/**
 * Sign-off domain: requests, the review queue, decisions with the verdict snapshot,
 * reopening, and the state and stocking plan the tank page shows. Routes stay thin and
 * call these; scoping comes from server/utils/access.ts.
 */
import { randomBytes } from 'node:crypto'
import { and, asc, desc, eq, inArray, ne, sql } from 'drizzle-orm'
import { evaluateCycle } from '#shared/cycle/engine'
import type { Verdict } from '#shared/cycle/types'
import { acclimationSettingsOf, datedAcclimation, overrideGrounds, stockingSteps, type AcclimationSettings } from '#shared/sign-off/plan'
import { OVERRIDE_REASON_MESSAGE } from '#shared/schemas/sign-off'
import type { ReviewItem, SignOffRecord, SignOffRecordWithSnapshot, SignOffSnapshot, SignOffState, StockingPlanView } from '#shared/types/sign-off'
import type { CyclePhase } from '#shared/types/tanks'
import { readOrganisationSettings } from '../db/settings'
import { cycleInputFor } from '../db/verdicts'
import { captureSignedFacts } from '../domain/sign-off/signed-record'
import { alerts, clients, events, planStages, signOffs, tankVerdicts, tanks, users } from '../db/schema'
import { canManageTank, visibleTankCondition, type Actor } from './access'
import { currentApprovedSignOff } from './sign-off-lock'

type TankRow = typeof tanks.$inferSelect
type SignOffRow = typeof signOffs.$inferSelect

const CROCKFORD = '0123456789ABCDEFGHJKMNPQRSTVWXYZ'

/** A random, unguessable code (120 bits) shaped TW-XXXX-XXXX-XXXX-XXXX-XXXX-XXXX. */
export function newVerificationCode(): string {
  const bytes = randomBytes(15)
  let bits = 0
  let value = 0
  let out = ''
  for (const byte of bytes) {
    value = (value << 8) | byte
    bits += 8
    while (bits >= 5) {
      out += CROCKFORD[(value >>> (bits - 5)) & 31]
      bits -= 5
    }
  }
  return `TW-${out.match(/.{4}/g)!.join('-')}`
}

/** Names of an organisation's users by id, for shaping responses. */
export function userNames(organisationId: string): Map<string, string> {
  const rows = useDB().select({ id: users.id, name: users.name }).from(users).where(eq(users.organisationId, organisationId)).all()
  return new Map(rows.map(r => [r.id, r.name]))
}

const nameOf = (names: Map<string, string>, id: string | null) => (id ? names.get(id) ?? null : null)

export function toSignOffRecord(row: SignOffRow, names: Map<string, string>): SignOffRecord {
  return {
    id: row.id,
    status: row.status,
    requestedAt: row.requestedAt,
    requestedByName: nameOf(names, row.requestedBy),
    requestNote: row.requestNote,
    decidedAt: row.decidedAt,
    decidedByName: nameOf(names, row.decidedBy),
    decisionNote: row.decisionNote,
    override: row.override,
    ruleSetVersion: row.ruleSetVersion,
    reopenedAt: row.reopenedAt,
    reopenedByName: nameOf(names, row.reopenedBy),
    reopenReason: row.reopenReason,
    verificationCode: row.verificationCode,
  }
}

export function toSignOffRecordWithSnapshot(row: SignOffRow, names: Map<string, string>): SignOffRecordWithSnapshot {
  return { ...toSignOffRecord(row, names), snapshot: row.snapshot ?? null }
}

/** Every sign-off of a tank, newest first. */
export function signOffHistory(tankId: string): SignOffRow[] {
  return useDB().select().from(signOffs).where(eq(signOffs.tankId, tankId)).orderBy(desc(signOffs.requestedAt), desc(signOffs.createdAt)).all()
}

/** The request waiting for a decision, if any. */
export function pendingRequest(tankId: string): SignOffRow | undefined {
  return useDB().select().from(signOffs).where(and(eq(signOffs.tankId, tankId), eq(signOffs.status, 'requested'))).get()
}

/** Alerts not yet resolved; every alert is raised by a danger finding. */
export function unresolvedAlertCount(tankId: string): number {
  return useDB().select({ n: sql<number>`count(*)` }).from(alerts)
    .where(and(eq(alerts.tankId, tankId), ne(alerts.status, 'resolved'))).get()?.n ?? 0
}

/** The engine's verdict for the tank as its data stands at `now`, with the input it was computed from. */
export function evaluateNow(tankId: string, now: Date) {
  const input = cycleInputFor(useDB(), tankId, now)
  if (!input) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  return { input, verdict: evaluateCycle(input) }
}

/** The tank's supervisor, or an admin of its organisation. */
export function maySignOff(actor: Actor, tank: Pick<TankRow, 'organisationId' | 'supervisorId'>): boolean {
  if (tank.organisationId !== actor.organisationId) return false
  return actor.role === 'admin' || (actor.role === 'supervisor' && tank.supervisorId === actor.id)
}

/** The company's sign-off policy (settings.signOff.requesterMayApprove): may the requester approve their own sign-off request. */
export function selfApprovalAllowed(organisationId: string): boolean {
  return readOrganisationSettings(useDB(), organisationId).signOff.requesterMayApprove
}

function conflict(message: string): never {
  throw createError({ statusCode: 409, statusMessage: message })
}

/** Asks for sign-off of a cycle the engine judges complete; the tank becomes 'cycled'. */
export function requestSignOff(actor: Actor, tank: TankRow, note: string, now = new Date()): SignOffRow {
  if (!canManageTank(actor, tank)) throw createError({ statusCode: 403, statusMessage: 'Only the company\'s aquarists and admins may ask for sign-off' })
  if (tank.status !== 'cycling' && tank.status !== 'cycled') conflict(`A tank that is ${tank.status} cannot be put up for sign-off`)
  if (pendingRequest(tank.id)) conflict('A sign-off request is already waiting for the supervisor')
  const { verdict } = evaluateNow(tank.id, now)
  if (verdict.phase !== 'complete') conflict('The engine does not judge this cycle complete yet; keep testing until it does')
  const at = now.toISOString()
  return useDB().transaction(() => {
    const row = useDB().insert(signOffs).values({
      organisationId: tank.organisationId, tankId: tank.id, requestedBy: actor.id, requestedAt: at, requestNote: note || null, status: 'requested',
    }).returning().get()
    moveTank({ tankId: tank.id, trigger: 'sign-off-requested', actor })
    writeAudit(actor, { action: 'sign-off.request', entity: 'sign_off', entityId: row.id, before: { tankStatus: tank.status }, after: { tankId: tank.id, note: row.requestNote, tankStatus: 'cycled' } })
    return row
  })
}

/** The requests waiting for this supervisor (an admin: for the whole company), oldest first. */
export function reviewQueue(actor: Actor, now = new Date()): ReviewItem[] {
  const conditions = [eq(signOffs.status, 'requested'), visibleTankCondition(actor)]
  if (actor.role === 'supervisor') conditions.push(eq(tanks.supervisorId, actor.id))
  const rows = useDB().select({ signOff: signOffs, tank: tanks, clientName: clients.name, phase: tankVerdicts.phase, verdict: tankVerdicts.verdict })
    .from(signOffs)
    .innerJoin(tanks, eq(tanks.id, signOffs.tankId))
    .innerJoin(clients, eq(clients.id, tanks.clientId))
    .leftJoin(tankVerdicts, eq(tankVerdicts.tankId, tanks.id))
    .where(and(...conditions))
    .orderBy(asc(signOffs.requestedAt), asc(signOffs.id)).all()
  const tankIds = rows.map(r => r.tank.id)
  const alertCounts = new Map<string, number>()
  if (tankIds.length) {
    const counted = useDB().select({ tankId: alerts.tankId, n: sql<number>`count(*)` }).from(alerts)
      .where(and(inArray(alerts.tankId, tankIds), ne(alerts.status, 'resolved'))).groupBy(alerts.tankId).all()
    for (const c of counted) alertCounts.set(c.tankId, c.n)
  }
  const names = userNames(actor.organisationId)
  return rows.map(({ signOff, tank, clientName, phase, verdict }) => ({
    signOffId: signOff.id,
    tankId: tank.id,
    tankName: tank.name,
    clientName,
    supervisorName: nameOf(names, tank.supervisorId),
    requestedAt: signOff.requestedAt,
    requestedByName: nameOf(names, signOff.requestedBy),
    requestNote: signOff.requestNote,
    phase: (phase as CyclePhase | null) ?? null,
    daysCycling: tank.cycleStartedAt ? Math.max(0, Math.floor((now.getTime() - Date.parse(tank.cycleStartedAt)) / 86_400_000)) : null,
    openAlerts: alertCounts.get(tank.id) ?? 0,
    // The stored verdict, so the queue need not re-run the engine per tank; the decision re-evaluates.
    overrideGrounds: overrideGrounds({ phase: (phase ?? 'not-started') as CyclePhase, findings: (verdict?.findings ?? []) }, alertCounts.get(tank.id) ?? 0),
  }))
}

export interface DecisionResult {
  signOff: SignOffRow
  verificationCode: string | null
}

/**
 * Approves or returns the waiting request. The engine input and verdict at this moment are
 * stored with the decision; approving against the verdict needs a written reason (400).
 */
export function decideSignOff(actor: Actor, tank: TankRow, decision: 'approve' | 'return', note: string, now = new Date()): DecisionResult {
  if (!maySignOff(actor, tank)) throw createError({ statusCode: 403, statusMessage: 'Only this tank\'s supervisor or an admin may decide' })
  const request = pendingRequest(tank.id)
  if (!request) conflict('No sign-off request is waiting for this tank')
  // Four eyes: whoever asked does not approve, unless the company allows it and a reason is written.
  if (decision === 'approve' && request.requestedBy === actor.id) {
    if (!selfApprovalAllowed(tank.organisationId)) throw createError({ statusCode: 403, statusMessage: 'You asked for this sign-off; another supervisor or an admin must approve it' })
    if (note.length < 3) {
      const message = 'You asked for this sign-off yourself: write why you approve it without a second person.'
      throw createError({ statusCode: 400, statusMessage: 'Validation Error', message, data: { issues: [{ field: 'note', message }] } })
    }
  }
  const { input, verdict } = evaluateNow(tank.id, now)
  const unresolvedAlerts = unresolvedAlertCount(tank.id)
  const grounds = overrideGrounds(verdict, unresolvedAlerts)
  const override = decision === 'approve' && grounds.length > 0
  if (override && note.length < 3) {
    const message = OVERRIDE_REASON_MESSAGE
    throw createError({ statusCode: 400, statusMessage: 'Validation Error', message, data: { issues: [{ field: 'note', message }], overrideGrounds: grounds } })
  }
  // The tank's facts and stages are kept with the decision: the certificate prints them, never the live tank.
  const facts = captureSignedFacts(useDB(), tank.id, actor.id)
  // The tank's own lighting acclimation, kept with the decision so the plan stays as signed.
  const acclimation = acclimationSettingsOf(useDB().select({ key: planStages.key, data: planStages.data }).from(planStages).where(eq(planStages.tankId, tank.id)).all())
  const snapshot: SignOffSnapshot = { facts, input, verdict, overrideGrounds: decision === 'approve' ? grounds : [], unresolvedAlerts, acclimation }
  const at = now.toISOString()
  const code = decision === 'approve' ? newVerificationCode() : null
  const row = useDB().transaction(() => {
    const updated = useDB().update(signOffs).set({
      status: decision === 'approve' ? 'approved' : 'returned',
      decidedBy: actor.id,
      decidedAt: at,
      decisionNote: note || null,
      override,
      snapshot,
      ruleSetVersion: verdict.ruleSetVersion,
      verificationCode: code,
    }).where(and(eq(signOffs.id, request.id), eq(signOffs.status, 'requested'))).returning().get()
    if (!updated) conflict('This request was decided a moment ago')
    const moved = moveTank({ tankId: tank.id, trigger: decision === 'approve' ? 'sign-off-approved' : 'sign-off-returned', actor })
    writeAudit(actor, {
      action: decision === 'approve' ? (override ? 'sign-off.approve-override' : 'sign-off.approve') : 'sign-off.return',
      entity: 'sign_off',
      entityId: request.id,
      before: { status: 'requested', tankStatus: tank.status },
      after: { status: updated.status, tankStatus: moved.status, note: updated.decisionNote, override, overrideGrounds: snapshot.overrideGrounds, phase: verdict.phase, ruleSetVersion: verdict.ruleSetVersion },
    })
    return updated
  })
  return { signOff: row, verificationCode: code }
}

/** Reopens the current approved sign-off with a reason; the record unlocks and the tank goes back to cycling. */
export function reopenSignOff(actor: Actor, tank: TankRow, reason: string, now = new Date()): SignOffRow {
  if (!maySignOff(actor, tank)) throw createError({ statusCode: 403, statusMessage: 'Only this tank\'s supervisor or an admin may reopen a sign-off' })
  const current = currentApprovedSignOff(tank.id)
  if (!current) conflict('This tank has no sign-off to reopen')
  const at = now.toISOString()
  return useDB().transaction(() => {
    const row = useDB().update(signOffs).set({ status: 'reopened', reopenedBy: actor.id, reopenedAt: at, reopenReason: reason })
      .where(and(eq(signOffs.id, current.id), eq(signOffs.status, 'approved'))).returning().get()
    if (!row) conflict('This sign-off was reopened a moment ago')
    moveTank({ tankId: tank.id, trigger: 'sign-off-reopened', actor })
    writeAudit(actor, { action: 'sign-off.reopen', entity: 'sign_off', entityId: row.id, before: { status: 'approved', tankStatus: tank.status }, after: { status: 'reopened', reason, tankStatus: 'cycling' } })
    return row
  })
}

/** The livestock and lighting plan for the first weeks after the sign-off, lighting as signed. */
export function stockingPlan(signedAt: string, verdict: Verdict, acclimation?: AcclimationSettings): StockingPlanView {
  return { signedAt, steps: stockingSteps(verdict), lighting: datedAcclimation(signedAt, acclimation) }
}

/** Everything the tank page needs to show and offer about sign-off. */
export function signOffState(actor: Actor, tank: TankRow, now = new Date()): SignOffState {
  const names = userNames(tank.organisationId)
  const history = signOffHistory(tank.id)
  const { verdict } = evaluateNow(tank.id, now)
  const approved = history.find(r => r.status === 'approved') ?? null
  const pending = history.find(r => r.status === 'requested') ?? null
  const grounds = overrideGrounds(verdict, unresolvedAlertCount(tank.id))
  const signedPhase = tank.status === 'signed-off' || tank.status === 'stocking'
  return {
    tankStatus: tank.status,
    phase: verdict.phase,
    current: history[0] ? toSignOffRecord(history[0], names) : null,
    history: history.map(r => toSignOffRecord(r, names)),
    overrideGrounds: grounds,
    lockedUntil: approved?.decidedAt ?? null,
    canRequest: canManageTank(actor, tank) && (tank.status === 'cycling' || tank.status === 'cycled') && !pending && verdict.phase === 'complete',
    canDecide: maySignOff(actor, tank) && !!pending,
    canReopen: maySignOff(actor, tank) && !!approved,
    canStartStocking: canManageTank(actor, tank) && tank.status === 'signed-off',
    hasCertificate: !!approved,
    plan: approved && signedPhase && approved.decidedAt ? stockingPlan(approved.decidedAt, verdict, approved.snapshot?.acclimation) : null,
  }
}

/**
 * After a change to a signed-off tank: livestock logged by staff after the sign-off means
 * stocking has begun. A client's livestock event is recorded (the engine sees it) but
 * does not move the tank's status: only staff start stocking.
 */
export function advanceToStockingIfLivestock(tankId: string): void {
  const tank = useDB().select({ status: tanks.status }).from(tanks).where(eq(tanks.id, tankId)).get()
  if (tank?.status !== 'signed-off') return
  const approved = currentApprovedSignOff(tankId)
  if (!approved?.decidedAt) return
  const livestock = useDB().select({ id: events.id }).from(events)
    .innerJoin(users, eq(users.id, events.enteredBy))
    .where(and(eq(events.tankId, tankId), eq(events.kind, 'livestock-added'), ne(users.role, 'client'), sql`${events.at} > ${approved.decidedAt}`)).get()
  if (livestock) moveTank({ tankId, trigger: 'livestock-logged', actor: null })
}
