/**
 * A sign-off decision on a tank with a long history, made wholly in a worker thread: the tank's
 * history read anew, the engine run over it, and the decision with its engine input (tens of MB
 * of JSON for an imported log) written in one immediate transaction on this thread's own
 * connection. The request loop gets back only the decided row, which holds no input: copying the
 * input across, writing it and answering it held up every other company for seconds.
 * The same framework-free pieces as the loop's path (checkSignOffDecision, evaluateForSignOff,
 * decideSignOff, onCurrentEvaluation); its refusals come back as what they say (refusal-transfer.ts).
 */
import { eq } from 'drizzle-orm'
import { tanks } from '#server/db/schema'
import { checkSignOffDecision, decideSignOff, type DecisionResult } from '#server/domain/sign-off/commands'
import { evaluateForSignOff, onCurrentEvaluation } from '#server/domain/sign-off/evaluation'
import type { SignOffActor } from '#server/domain/sign-off/records'
import { carriedRefusal, type CarriedRefusal } from '#server/domain/sign-off/refusal-transfer'
import { workerConnection } from './connection'

export interface SignOffDecisionTask {
  dbPath: string
  tankId: string
  /** Who decides: the request loop has checked they may see the tank. */
  actor: SignOffActor
  decision: 'approve' | 'return'
  note: string
}

export type SignOffDecisionOutcome
  = | { kind: 'decided', result: DecisionResult }
    | { kind: 'refused', refusal: CarriedRefusal }
    | { kind: 'missing' }

/** Thrown inside the task when the tank is gone: answered as 'missing'. */
class TankGone extends Error {}

/** Decides as the loop would (checked, evaluated, stored; evaluated again when the tank changed meanwhile). */
export async function signOffDecision(task: SignOffDecisionTask): Promise<SignOffDecisionOutcome> {
  const db = workerConnection(task.dbPath)
  // Read again before each step: the tank's status may have moved while it was evaluated.
  const tank = () => db.select().from(tanks).where(eq(tanks.id, task.tankId)).get() ?? fail()
  const fail = (): never => {
    throw new TankGone()
  }
  try {
    const result = await onCurrentEvaluation({
      check: () => checkSignOffDecision(db, task.actor, tank(), task.decision, task.note),
      evaluate: async () => evaluateForSignOff(db, task.tankId, new Date()) ?? fail(),
      command: evaluation => decideSignOff(db, task.actor, tank(), task.decision, task.note, evaluation),
    })
    return { kind: 'decided', result }
  }
  catch (error) {
    if (error instanceof TankGone) return { kind: 'missing' }
    const refusal = carriedRefusal(error)
    if (refusal) return { kind: 'refused', refusal }
    throw error
  }
}
