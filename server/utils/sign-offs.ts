/**
 * Nitro glue for sign-off: runs the framework-free commands and reads in
 * server/domain/sign-off/ on the process's database, with the actor's scope from
 * access.ts, and turns their refusals into HTTP answers. Routes stay thin and call these.
 */
import { requestSignOff as requestInDb, decideSignOff as decideInDb, reopenSignOff as reopenInDb, advanceToStockingIfLivestock as advanceInDb, type DecisionResult } from '#server/domain/sign-off/commands'
import { evaluateNow as evaluateInDb, organisationUserNames, pendingRequest as pendingInDb, signOffHistory as historyInDb, unresolvedAlertCount as alertCountInDb, type SignOffRow, type TankRow } from '#server/domain/sign-off/records'
import { SignOffRefused } from '#server/domain/sign-off/refusal'
import { reviewQueue as reviewQueueInDb, signOffState as stateInDb } from '#server/domain/sign-off/state'
import { TankStatusRefused } from '#server/domain/tanks/status'
import { canManageTank, visibleTankCondition, type Actor } from './access'

export { maySignOff, toSignOffRecord, toSignOffRecordWithSnapshot } from '#server/domain/sign-off/records'

/** Runs a sign-off command or read, answering its refusal as HTTP: a refused field is a 400 with that field's message. */
export function signOffAnswer<T>(run: () => T): T {
  try {
    return run()
  }
  catch (error) {
    if (error instanceof SignOffRefused) {
      if (error.details.field) fieldError([{ field: error.details.field, message: error.message }], error.details.data)
      throw createError({ statusCode: error.status, statusMessage: error.message, data: error.details.data })
    }
    if (error instanceof TankStatusRefused) throw tankStatusHttpError(error)
    throw error
  }
}

/** Names of an organisation's users by id, for shaping responses. */
export function userNames(organisationId: string): Map<string, string> {
  return organisationUserNames(useDB(), organisationId)
}

/** Every sign-off of a tank, newest first. */
export function signOffHistory(tankId: string): SignOffRow[] {
  return historyInDb(useDB(), tankId)
}

/** The request waiting for a decision, if any. */
export function pendingRequest(tankId: string): SignOffRow | undefined {
  return pendingInDb(useDB(), tankId)
}

/** Alerts not yet resolved on the tank. */
export function unresolvedAlertCount(tankId: string): number {
  return alertCountInDb(useDB(), tankId)
}

/** The engine's verdict for the tank as its data stands at `now`, with its input; 404 for no such tank. */
export function evaluateNow(tankId: string, now: Date) {
  return signOffAnswer(() => evaluateInDb(useDB(), tankId, now))
}

/** Asks for sign-off of a cycle the engine judges complete; the tank becomes 'cycled'. */
export function requestSignOff(actor: Actor, tank: TankRow, note: string, now = new Date()): SignOffRow {
  return signOffAnswer(() => requestInDb(useDB(), actor, tank, note, canManageTank(actor, tank), now))
}

/** The requests waiting for this supervisor (an admin: for the whole company), oldest first. */
export function reviewQueue(actor: Actor, now = new Date()) {
  return reviewQueueInDb(useDB(), actor, visibleTankCondition(actor), now)
}

/** Approves or returns the waiting request, with the verdict snapshot. */
export function decideSignOff(actor: Actor, tank: TankRow, decision: 'approve' | 'return', note: string, now = new Date()): DecisionResult {
  return signOffAnswer(() => decideInDb(useDB(), actor, tank, decision, note, now))
}

/** Reopens the current approved sign-off with a reason. */
export function reopenSignOff(actor: Actor, tank: TankRow, reason: string, now = new Date()): SignOffRow {
  return signOffAnswer(() => reopenInDb(useDB(), actor, tank, reason, now))
}

/** Everything the tank page needs to show and offer about sign-off. */
export async function signOffState(actor: Actor, tank: TankRow, now = new Date()) {
  // The stored verdict, made again first when too old (in the pool for a long history): the page never runs the engine on the request loop.
  const stored = await currentVerdictRow(tank.id, now)
  if (!stored) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  return signOffAnswer(() => stateInDb(useDB(), actor, tank, canManageTank(actor, tank), stored.verdict))
}

/** Livestock logged by staff after the sign-off moves the tank to stocking (called from onTankDataChanged). */
export function advanceToStockingIfLivestock(tankId: string): void {
  signOffAnswer(() => advanceInDb(useDB(), tankId))
}
