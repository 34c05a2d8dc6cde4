/**
 * A tank's verdict evaluated off the request loop (in the heavy-work pool), one evaluation per
 * tank at a time. Over a long history the engine takes long enough to run it in a worker, whose
 * thread every company's heavy work shares; when each of many saves arriving together on one
 * tank ran its own evaluation (and ran it again once overtaken by newer saves), 16 saves at once
 * meant up to 48 evaluations of the same history in a row.
 *
 * Per tank at most one evaluation runs and at most one waits. A change noted while one runs
 * joins the waiting one (made if there is none), which starts when the running one ends: every
 * change that joined it was committed before it joined, so it reads all of them. Each caller is
 * answered with the verdict of the first evaluation that started after its change was noted, so
 * a save's answer includes the save. The result is stored only if the stored verdict was not
 * made from newer data (newest-verdict.ts: the request loop stores too, for a tank that fell
 * back under LONG_HISTORY_TESTS). Framework-free: takes a `Db` and the evaluation to run, so
 * the server and the tests share it.
 */
import type { TidewrightDB } from '#server/db/connection'
import { whenWritable, WRITE_WAIT_MS } from '#server/db/write-wait'
import type { TankEvaluation } from '#server/db/verdicts'
import type { AppendedTest } from '#server/domain/readings/engine-input-cache'
import { storeVerdictIfNewer, tankDataRevision, type VerdictRefresh } from './newest-verdict'

/**
 * The engine's verdict and forecast as of `now`, computed elsewhere (the heavy-work pool), told
 * of the tests saved since the last evaluation in the order they were saved; null when there is
 * no such tank.
 */
export type EvaluateElsewhere = (tankId: string, now: Date, appended: readonly AppendedTest[]) => Promise<TankEvaluation | null>

/** One evaluation and the changes that joined it before it started. */
interface Evaluation {
  db: TidewrightDB
  evaluate: EvaluateElsewhere
  /** How long its store waits for another connection's write lock (whenWritable). */
  writeWaitMs: number
  /** Each joiner's time: the evaluation is made as of the latest of them. */
  clocks: (() => Date)[]
  /**
   * The tests its joiners saved, in the order they joined: a save joins right after its commit,
   * in the same synchronous step, so this is the order of their counts (`revisionAfter`).
   */
  appended: AppendedTest[]
  answer: Promise<VerdictRefresh | undefined>
  resolve: (refresh: VerdictRefresh | undefined) => void
  reject: (error: unknown) => void
}

/** Per tank with an evaluation running: the one waiting to start after it, if any. */
const running = new Map<string, { waiting?: Evaluation }>()

function newEvaluation(db: TidewrightDB, evaluate: EvaluateElsewhere, writeWaitMs: number): Evaluation {
  let resolve!: Evaluation['resolve']
  let reject!: Evaluation['reject']
  const answer = new Promise<VerdictRefresh | undefined>((res, rej) => {
    resolve = res
    reject = rej
  })
  return { db, evaluate, writeWaitMs, clocks: [], appended: [], answer, resolve, reject }
}

/**
 * Refreshes the tank's verdict in the pool after a change that the caller has committed and
 * noted (noteTankDataChanged). `clock`: the change's time (a test injects one; otherwise the
 * clock when the evaluation starts). `appended`: the test just saved, if any. Resolves with the
 * verdict of the first evaluation started after the change was noted and whether it was stored,
 * or undefined when there is no such tank; rejects when that evaluation fails, or when its store
 * waited past `writeWaitMs` for another connection's write lock (WriteWaitExceeded).
 */
export function refreshVerdictOffLoop(db: TidewrightDB, tankId: string, evaluate: EvaluateElsewhere, clock: () => Date = () => new Date(), appended?: AppendedTest, writeWaitMs = WRITE_WAIT_MS): Promise<VerdictRefresh | undefined> {
  const tank = running.get(tankId)
  const evaluation = tank ? (tank.waiting ??= newEvaluation(db, evaluate, writeWaitMs)) : newEvaluation(db, evaluate, writeWaitMs)
  evaluation.clocks.push(clock)
  if (appended) evaluation.appended.push(appended)
  if (!tank) start(tankId, evaluation)
  return evaluation.answer
}

/** Runs the evaluation, answers its joiners, then starts the one that waited for it, or leaves the tank idle. */
function start(tankId: string, evaluation: Evaluation): void {
  const tank: { waiting?: Evaluation } = {}
  running.set(tankId, tank)
  evaluateAndStore(tankId, evaluation)
    .then(evaluation.resolve, evaluation.reject)
    .finally(() => {
      running.delete(tankId)
      if (tank.waiting) start(tankId, tank.waiting)
    })
}

async function evaluateAndStore(tankId: string, { db, evaluate, writeWaitMs, clocks, appended }: Evaluation): Promise<VerdictRefresh | undefined> {
  // Read before the evaluation reads anything: what it reads is at least this new.
  const revision = tankDataRevision(tankId)
  // The latest of its joiners' times: a joiner's test taken by its own time is taken by then too.
  const now = new Date(Math.max(...clocks.map(clock => clock().getTime())))
  const evaluation = await evaluate(tankId, now, appended)
  if (!evaluation) return undefined
  // The tank is one with a long history, the kind an import writes: its lock is waited for off the loop.
  const stored = await whenWritable(db, () => storeVerdictIfNewer(db, tankId, evaluation, now, revision), writeWaitMs)
  return { verdict: evaluation.verdict, stored }
}
