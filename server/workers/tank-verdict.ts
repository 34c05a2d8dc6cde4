/**
 * The engine's verdict for a tank as its data stands, computed in a worker thread: over
 * years of imported tests the engine takes long enough that running it on the request
 * loop (as the evidence page does on every load) would hold up every other company.
 * Calls the same framework-free piece the server does (evaluateTankNow).
 */
import { evaluateTankNow, type TankEvaluation } from '#server/db/verdicts'
import { workerConnection } from './connection'

export interface TankVerdictTask {
  dbPath: string
  tankId: string
  nowMs: number
}

/** The verdict and its forecast, or null when there is no such tank. */
export function tankVerdict(task: TankVerdictTask): TankEvaluation | null {
  return evaluateTankNow(workerConnection(task.dbPath), task.tankId, new Date(task.nowMs)) ?? null
}
