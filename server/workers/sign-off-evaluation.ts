/**
 * The evaluation a sign-off request rests on, made in a worker thread for a tank
 * with a long history: the tank's whole history read anew and the engine run over it take long
 * enough (about a second for 100,000 tests) that on the request loop they would hold up every
 * other company. Calls the same framework-free piece the loop does (evaluateForSignOff), on this
 * thread's own connection: the revision it reads is the database's, counted on every connection,
 * and the tank's profile and thresholds it hands back are the ones the verdict was made under.
 */
import { evaluateForSignOff, withoutInput, type SignOffVerdict } from '#server/domain/sign-off/evaluation'
import { workerConnection } from './connection'

export interface SignOffEvaluationTask {
  dbPath: string
  tankId: string
  nowMs: number
}

/**
 * The tank's verdict, data revision and the settings it was made under as of the task's moment,
 * without the input (a request records none, and copying a long history between threads holds up
 * the request loop; a decision is made wholly in the pool, sign-off-decision.ts), or null when
 * there is no such tank.
 */
export function signOffEvaluation(task: SignOffEvaluationTask): SignOffVerdict | null {
  const evaluation = evaluateForSignOff(workerConnection(task.dbPath), task.tankId, new Date(task.nowMs))
  return evaluation ? withoutInput(evaluation) : null
}
