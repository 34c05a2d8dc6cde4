/**
 * What the pages read about sign-off, framework-free: the supervisor's review queue, the
 * tank page's sign-off state and the stocking plan that follows an approval.
 */
import { and, asc, eq, inArray, ne, sql, type SQL } from 'drizzle-orm'
import type { Verdict } from '#shared/cycle/types'
import { datedAcclimation, overrideGrounds, stockingSteps, type AcclimationSettings } from '#shared/sign-off/plan'
import type { ReviewItem, SignOffState, StockingPlanView } from '#shared/types/sign-off'
import type { CyclePhase } from '#shared/types/tanks'
import type { Db } from '#server/db/connection'
import { alerts, clients, signOffs, tankVerdicts, tanks } from '#server/db/schema'
import { maySignOff, nameOf, organisationUserNames, signOffHistory, toSignOffRecord, unresolvedAlertCount, type SignOffActor, type TankRow } from './records'

/**
 * The requests waiting for this supervisor (an admin: for the whole company), oldest first.
 * `visible` is the reviewer's tank scope (server/utils/access.ts, visibleTankCondition).
 */
export function reviewQueue(db: Db, reviewer: SignOffActor, visible: SQL, now = new Date()): ReviewItem[] {
  const conditions = [eq(signOffs.status, 'requested'), visible]
  if (reviewer.role === 'supervisor') conditions.push(eq(tanks.supervisorId, reviewer.id))
  const rows = db.select({ signOff: signOffs, tank: tanks, clientName: clients.name, phase: tankVerdicts.phase, verdict: tankVerdicts.verdict })
    .from(signOffs)
    .innerJoin(tanks, eq(tanks.id, signOffs.tankId))
    .innerJoin(clients, eq(clients.id, tanks.clientId))
    .leftJoin(tankVerdicts, eq(tankVerdicts.tankId, tanks.id))
    .where(and(...conditions))
    .orderBy(asc(signOffs.requestedAt), asc(signOffs.id)).all()
  const tankIds = rows.map(r => r.tank.id)
  const alertCounts = new Map<string, number>()
  if (tankIds.length) {
    const counted = db.select({ tankId: alerts.tankId, n: sql<number>`count(*)` }).from(alerts)
      .where(and(inArray(alerts.tankId, tankIds), ne(alerts.status, 'resolved'))).groupBy(alerts.tankId).all()
    for (const c of counted) alertCounts.set(c.tankId, c.n)
  }
  const names = organisationUserNames(db, reviewer.organisationId)
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

/** The livestock and lighting plan for the first weeks after the sign-off, lighting as signed. */
export function stockingPlan(signedAt: string, verdict: Verdict, acclimation?: AcclimationSettings): StockingPlanView {
  return { signedAt, steps: stockingSteps(verdict), lighting: datedAcclimation(signedAt, acclimation) }
}

/**
 * Everything the tank page needs to show and offer about sign-off. `mayManage`: whether
 * the viewer may change this tank (server/utils/access.ts decides). `verdict`: the tank's
 * current stored one (a request or a decision evaluates the tank again, `evaluateForSignOff`).
 */
export function signOffState(db: Db, viewer: SignOffActor, tank: TankRow, mayManage: boolean, verdict: Verdict): SignOffState {
  const names = organisationUserNames(db, tank.organisationId)
  const history = signOffHistory(db, tank.id)
  const approved = history.find(r => r.status === 'approved') ?? null
  const pending = history.find(r => r.status === 'requested') ?? null
  const grounds = overrideGrounds(verdict, unresolvedAlertCount(db, tank.id))
  const signedPhase = tank.status === 'signed-off' || tank.status === 'stocking'
  return {
    tankStatus: tank.status,
    phase: verdict.phase,
    current: history[0] ? toSignOffRecord(history[0], names) : null,
    history: history.map(r => toSignOffRecord(r, names)),
    overrideGrounds: grounds,
    lockedUntil: approved?.decidedAt ?? null,
    canRequest: mayManage && (tank.status === 'cycling' || tank.status === 'cycled') && !pending && verdict.phase === 'complete',
    canDecide: maySignOff(viewer, tank) && !!pending,
    canReopen: maySignOff(viewer, tank) && !!approved,
    canStartStocking: mayManage && tank.status === 'signed-off',
    hasCertificate: !!approved,
    plan: approved && signedPhase && approved.decidedAt ? stockingPlan(approved.decidedAt, verdict, approved.snapshot?.acclimation) : null,
  }
}
