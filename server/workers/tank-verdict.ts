/**
 * The engine's verdict for a tank as its data stands, computed in a worker thread: over
 * years of imported tests the engine takes long enough that running it on the request
 * loop (as the evidence page does on every load) would hold up every other company.
 * Calls the same framework-free piece the server does (evaluateTankNow).
 */
import { evaluateTankNow, type TankEvaluation } from '#server/db/verdicts'
import { noteTestAppended, type AppendedTest } from '#server/domain/readings/engine-input-cache'
import { workerConnection } from './connection'

export interface TankVerdictTask {
  dbPath: string
  tankId: string
  nowMs: number
  /**
   * Tests saved on the request loop's connection since the tank's last evaluation, in the order
   * they were saved: placed into this thread's kept copy one by one instead of reading the history
   * again (one that does not follow the copy drops it, and the history is read).
   */
  appended: readonly AppendedTest[]
}

/** The verdict and its forecast, or null when there is no such tank. */
export function tankVerdict(task: TankVerdictTask): TankEvaluation | null {
  const db = workerConnection(task.dbPath)
  for (const test of task.appended) noteTestAppended(db, task.tankId, test.row, test.revisionAfter)
  return evaluateTankNow(db, task.tankId, new Date(task.nowMs)) ?? null
}
