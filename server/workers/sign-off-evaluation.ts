/**
 * The evaluation a sign-off request or decision rests on, made in a worker thread for a tank
 * with a long history: the tank's whole history read anew and the engine run over it take long
 * enough (about a second for 100,000 tests) that on the request loop they would hold up every
 * other company. Calls the same framework-free piece the loop does (evaluateForSignOff), on this
 * thread's own connection: the revision it reads is the database's, counted on every connection,
 * and the tank's profile and thresholds it hands back are the ones the verdict was made under.
 */
import { evaluateForSignOff, withoutInput, type SignOffEvaluation, type SignOffVerdict } from '#server/domain/sign-off/evaluation'
import { workerConnection } from './connection'

export interface SignOffEvaluationTask {
  dbPath: string
  tankId: string
  nowMs: number
  /** Whether the input is wanted back (a decision records it; a request does not, and copying a long history between threads holds up the request loop). */
  withInput: boolean
}

/**
 * The tank's verdict, data revision, the settings it was made under and (when asked) input as of
 * the task's moment, or null when there is no such tank.
 */
export function signOffEvaluation(task: SignOffEvaluationTask): SignOffEvaluation | SignOffVerdict | null {
  const evaluation = evaluateForSignOff(workerConnection(task.dbPath), task.tankId, new Date(task.nowMs))
  if (!evaluation) return null
  return task.withInput ? evaluation : withoutInput(evaluation)
}
