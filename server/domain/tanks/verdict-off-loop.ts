/**
 * A tank's verdict evaluated off the request loop (in the heavy-work pool) and stored on the
 * main connection. Over a long history the engine takes seconds, so the refresh after a CSV
 * import runs it in a worker; meanwhile the request loop goes on and other writes may land
 * on the same tank (a test saved by hand refreshes the verdict at once). A verdict made from
 * data that has since moved is not stored over the newer one: the evaluation runs again.
 *
 * The tank's data revision counts the changes this process has reacted to. Every write to
 * a tank's readings, events or profile goes through onTankDataChanged, which notes it here
 * before it refreshes, so comparing the revision before the evaluation and before the store
 * tells whether a newer write (and its own refresh) came in between. Framework-free: takes a
 * `Db` and the evaluation to run, so the server and the tests share it.
 */
import type { Verdict } from '#shared/cycle/types'
import type { Db } from '#server/db/connection'
import { storeVerdict, type TankEvaluation } from '#server/db/verdicts'
import type { AppendedTest } from '#server/domain/readings/engine-input-cache'

/** How many times an evaluation overtaken by newer writes is run again before this refresh gives way to theirs. */
const MAX_ATTEMPTS = 3

const revisions = new Map<string, number>()

/** Notes that the tank's data changed (called before its verdict is refreshed). */
export function noteTankDataChanged(tankId: string): void {
  revisions.set(tankId, (revisions.get(tankId) ?? 0) + 1)
}

/** The tank's data revision in this process: moves on every noted change. */
export function tankDataRevision(tankId: string): number {
  return revisions.get(tankId) ?? 0
}

/** The engine's verdict and forecast as of `now`, computed elsewhere (the heavy-work pool); null when there is no such tank. */
export type EvaluateElsewhere = (tankId: string, now: Date, appended?: AppendedTest) => Promise<TankEvaluation | null>

/**
 * Evaluates the tank with `evaluate` (told of `appended`, the test just saved, if any) and
 * stores the verdict if no change was noted while it ran; otherwise runs it again. Returns the
 * stored verdict, or undefined when there is no such tank or every attempt was overtaken (the
 * writes that overtook it refresh the verdict themselves).
 */
export async function refreshVerdictOffLoop(db: Db, tankId: string, evaluate: EvaluateElsewhere, clock: () => Date = () => new Date(), appended?: AppendedTest): Promise<Verdict | undefined> {
  for (let attempt = 0; attempt < MAX_ATTEMPTS; attempt++) {
    const revision = tankDataRevision(tankId)
    const now = clock()
    // The saved test is handed over once: a later attempt follows other changes, and reads them.
    const evaluation = await evaluate(tankId, now, attempt === 0 ? appended : undefined)
    if (!evaluation) return undefined
    // Compared and stored in one synchronous step: no other write on this loop can come between.
    if (tankDataRevision(tankId) !== revision) continue
    storeVerdict(db, tankId, evaluation, now.toISOString())
    return evaluation.verdict
  }
  return undefined
}
