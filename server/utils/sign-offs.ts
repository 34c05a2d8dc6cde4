/**
 * Nitro glue for sign-off: runs the framework-free commands and reads in
 * server/domain/sign-off/ on the process's database, with the actor's scope from
 * access.ts, and turns their refusals into HTTP answers. Routes stay thin and call these.
 */
import { requestSignOff as requestInDb, decideSignOff as decideInDb, reopenSignOff as reopenInDb, advanceToStockingIfLivestock as advanceInDb, checkSignOffDecision, checkSignOffRequest, type DecisionResult } from '#server/domain/sign-off/commands'
import { evaluateForSignOff as evaluateInDb, onCurrentEvaluation, type SignOffVerdict } from '#server/domain/sign-off/evaluation'
import { organisationUserNames, pendingRequest as pendingInDb, signOffHistory as historyInDb, unresolvedAlertCount as alertCountInDb, type SignOffRow, type TankRow } from '#server/domain/sign-off/records'
import { SignOffRefused } from '#server/domain/sign-off/refusal'
import { reviewQueue as reviewQueueInDb, signOffState as stateInDb } from '#server/domain/sign-off/state'
import { hasLongHistory } from '#server/domain/tanks/long-history'
import { TankStatusRefused } from '#server/domain/tanks/status'
import { canManageTank, requireVisibleTank, visibleTankCondition, type Actor } from './access'
import { decideSignOffOffLoop, signOffVerdictOffLoop } from './heavy-work'

export { maySignOff, toSignOffRecord, toSignOffRecordWithSnapshot } from '#server/domain/sign-off/records'

/** Throws a sign-off refusal as its HTTP answer (a refused field: a 400 with that field's message), any other error as it is. */
function throwAnswered(error: unknown): never {
  if (error instanceof SignOffRefused) {
    if (error.details.field) fieldError([{ field: error.details.field, message: error.message }], error.details.data)
    throw createError({ statusCode: error.status, statusMessage: error.message, data: error.details.data })
  }
  if (error instanceof TankStatusRefused) throw tankStatusHttpError(error)
  throw error
}

/** Runs a sign-off command or read, answering its refusal as HTTP: a refused field is a 400 with that field's message. */
export function signOffAnswer<T>(run: () => T): T {
  try {
    return run()
  }
  catch (error) {
    throwAnswered(error)
  }
}

/** signOffAnswer for a command that awaits (an evaluation in the heavy-work pool). */
async function signOffAnswerLater<T>(run: () => Promise<T>): Promise<T> {
  try {
    return await run()
  }
  catch (error) {
    throwAnswered(error)
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

/**
 * What a sign-off request rests on: the tank's data revision and the verdict made from its history
 * read anew as of `now`. In the heavy-work pool for a long history (LONG_HISTORY_TESTS), without the
 * input (a request records none; the tank profile and thresholds the verdict was made under still
 * come back), so the request loop never runs the engine over an imported log; on the loop, at once,
 * for every other tank. 404 for no such tank.
 */
async function verdictForSignOff(tankId: string, now: Date): Promise<SignOffVerdict> {
  const db = useDB()
  return found(hasLongHistory(db, tankId) ? await signOffVerdictOffLoop(tankId, now) : evaluateInDb(db, tankId, now))
}

function found<E>(evaluation: E | null | undefined): E {
  if (!evaluation) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  return evaluation
}

/**
 * Runs a sign-off command on an evaluation of the tank made just before it (by `evaluate`),
 * evaluated again when the tank's tests or settings changed meanwhile (onCurrentEvaluation: three
 * tries, then 409). The tank is read again before each step: its status may have moved while the
 * evaluation was made.
 */
function onEvaluatedTank<T, E extends SignOffVerdict>(actor: Actor, tankId: string, evaluate: (tankId: string, now: Date) => Promise<E>, check: (tank: TankRow) => void, command: (tank: TankRow, evaluation: E) => T): Promise<T> {
  return signOffAnswerLater(() => onCurrentEvaluation({
    check: () => check(requireVisibleTank(actor, tankId)),
    evaluate: () => evaluate(tankId, new Date()),
    // Under the write lock, waited for off the loop: the tank is read again and the command runs in one step.
    command: evaluation => writeTransaction(() => command(requireVisibleTank(actor, tankId), evaluation)),
  }))
}

/** Asks for sign-off of a cycle the engine judges complete; the tank becomes 'cycled'. */
export function requestSignOff(actor: Actor, tank: TankRow, note: string): Promise<SignOffRow> {
  return onEvaluatedTank(actor, tank.id, verdictForSignOff,
    current => checkSignOffRequest(useDB(), current, canManageTank(actor, current)),
    (current, evaluation) => requestInDb(useDB(), actor, current, note, canManageTank(actor, current), evaluation))
}

/** The requests waiting for this supervisor (an admin: for the whole company), oldest first. */
export function reviewQueue(actor: Actor, now = new Date()) {
  return reviewQueueInDb(useDB(), actor, visibleTankCondition(actor), now)
}

/**
 * Approves or returns the waiting request, with the verdict snapshot and the engine input. For a
 * long history (LONG_HISTORY_TESTS) the whole decision is made in the heavy-work pool, which writes
 * the input there and hands back the decided row only: the request loop never holds, copies or
 * writes the input of an imported log. Every other tank is decided on the loop, by the same command.
 */
export function decideSignOff(actor: Actor, tank: TankRow, decision: 'approve' | 'return', note: string): Promise<DecisionResult> {
  if (hasLongHistory(useDB(), tank.id)) {
    const decider = { id: actor.id, organisationId: actor.organisationId, role: actor.role }
    return signOffAnswerLater(async () => found(await decideSignOffOffLoop({ tankId: tank.id, actor: decider, decision, note })))
  }
  return onEvaluatedTank(actor, tank.id, async (tankId, now) => found(evaluateInDb(useDB(), tankId, now)),
    current => checkSignOffDecision(useDB(), actor, current, decision, note),
    (current, evaluation) => decideInDb(useDB(), actor, current, decision, note, evaluation))
}

/** Reopens the current approved sign-off with a reason. */
export function reopenSignOff(actor: Actor, tank: TankRow, reason: string, now = new Date()): Promise<SignOffRow> {
  return signOffAnswerLater(() => writeTransaction(db => reopenInDb(db, actor, tank, reason, now)))
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
