/**
 * A tank with a long history has its verdict made in the heavy-work pool, one evaluation per
 * tank at a time: changes noted while one runs join the next, which starts once it ends (so it
 * reads all of them), and each caller gets the verdict of the first evaluation that started after
 * its change. A verdict is stored only when made from data at least as new as the stored one's,
 * whichever path stored that: the pool's, or the request loop's for a tank that fell back under
 * LONG_HISTORY_TESTS. Real migrated SQLite file with the demo company. The evaluation is a
 * function the tests hold open and let finish (or fail) when they choose, reading the data as it
 * stands when it starts, as a worker does; the worker's own function is called where what it
 * does with the tests saved meanwhile matters.
 */
import { randomUUID } from 'node:crypto'
import Database from 'better-sqlite3'
import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../../shared/cycle/engine'
import { forecastCycle } from '../../../../../shared/cycle/forecast'
import type { Verdict } from '../../../../../shared/cycle/types'
import { readings, tankVerdicts } from '../../../../../server/db/schema'
import { cycleInputFor, evaluateTankNow, type TankEvaluation } from '../../../../../server/db/verdicts'
import { tankDataRevisionInDb } from '../../../../../server/domain/readings/data-revision'
import { keptHistory, noteTestAppended, type AppendedTest } from '../../../../../server/domain/readings/engine-input-cache'
import { noteTankDataChanged, refreshVerdictOnLoop, storeVerdictIfNewer, tankDataRevision } from '../../../../../server/domain/tanks/newest-verdict'
import { refreshVerdictOffLoop, type EvaluateElsewhere } from '../../../../../server/domain/tanks/verdict-off-loop'
import { workerConnection } from '../../../../../server/workers/connection'
import { tankVerdict } from '../../../../../server/workers/tank-verdict'
import { seededDatabase } from '../../../../support/seeded-database'

const { db, dbPath, demo, now } = await seededDatabase('verdict-off-loop')

const storedRow = (tankId: string) => db.select().from(tankVerdicts).where(eq(tankVerdicts.tankId, tankId)).get()
const storedVerdict = (tankId: string) => storedRow(tankId)?.verdict
const engineNow = (tankId: string) => evaluateCycle(cycleInputFor(db, tankId, now)!)
const minutes = (n: number) => new Date(now.getTime() + n * 60_000)
/** Lets every promise chain that can run, run (an evaluation finished, the next one started). */
const settle = () => new Promise(resolve => setImmediate(resolve))

let saved = 0
/**
 * A test saved as the reading route saves it: inserted with the tank's count read right after the
 * insert, in its transaction; the connection's kept copy told; the change noted. Each a minute
 * after the one before, within the hour before `now`, with ammonia and nitrite high, so every
 * save changes what the engine says (its findings name the latest test).
 */
function saveTest(tankId: string): { appended: AppendedTest, revision: number } {
  const appended = db.transaction(() => {
    const row = db.insert(readings).values({
      id: randomUUID(), tankId, takenAt: minutes(-60 + saved++).toISOString(), enteredBy: demo.users.aquarist,
      ammoniaN: 3, nitriteN: 2, nitrateN: 5, pH: 8.1, temperatureC: 25, salinity: 35,
    }).returning().get()
    return { row, revisionAfter: tankDataRevisionInDb(db, tankId) }
  })
  noteTestAppended(db, tankId, appended.row, appended.revisionAfter)
  noteTankDataChanged(tankId)
  return { appended, revision: tankDataRevision(tankId) }
}

/** A test saved and the verdict refreshed off the loop with `evaluate`, as of `at`: what onTankDataChanged does for a long history. */
function saveAndRefresh(tankId: string, evaluate: EvaluateElsewhere, at = now) {
  const change = saveTest(tankId)
  return { ...change, answer: refreshVerdictOffLoop(db, tankId, evaluate, () => at, change.appended) }
}

interface Held {
  now: Date
  appended: readonly AppendedTest[]
  /** The tank's revision when the evaluation started. */
  revision: number
  evaluation: TankEvaluation
  finish: () => void
  fail: (error: Error) => void
}

/** An evaluation that reads the data when it starts and answers when the test says: every start is kept in `started`. */
function heldEvaluations() {
  const started: Held[] = []
  const evaluate: EvaluateElsewhere = (tankId, at, appended) => new Promise((resolve, reject) => {
    const evaluation = evaluateTankNow(db, tankId, at)!
    started.push({ now: at, appended, revision: tankDataRevision(tankId), evaluation, finish: () => resolve(evaluation), fail: reject })
  })
  return { started, evaluate }
}

describe('the verdict refreshed off the request loop', () => {
  it('stores the worker\'s verdict when nothing moved', async () => {
    const tankId = demo.tanks.lobby
    noteTankDataChanged(tankId)
    const refreshed = await refreshVerdictOffLoop(db, tankId, async (id, at, appended) => tankVerdict({ dbPath, tankId: id, nowMs: at.getTime(), appended }), () => now)
    expect(refreshed).toEqual({ verdict: engineNow(tankId), stored: true })
    expect(storedVerdict(tankId)).toEqual(engineNow(tankId))
    // The forecast lists show is stored with it, made from the same input.
    const input = cycleInputFor(db, tankId, now)!
    expect(storedRow(tankId)?.forecast).toEqual(forecastCycle(input, evaluateCycle(input)))
  })

  it('runs one evaluation at a time per tank: changes noted while it runs join one next evaluation', async () => {
    const tankId = demo.tanks.lounge
    const { started, evaluate } = heldEvaluations()
    const first = saveAndRefresh(tankId, evaluate)
    expect(started).toHaveLength(1)
    const joiners = Array.from({ length: 7 }, () => saveAndRefresh(tankId, evaluate))
    await settle()
    expect(started).toHaveLength(1)
    started[0]!.finish()
    await settle()
    expect(started).toHaveLength(2)
    // The tests saved meanwhile reach the next evaluation in the order they were saved.
    expect(started[1]!.appended.map(a => a.row.id)).toEqual(joiners.map(j => j.appended.row.id))
    started[1]!.finish()
    const answers = await Promise.all([first, ...joiners].map(c => c.answer))
    expect(started).toHaveLength(2)
    // Each caller has the verdict of the first evaluation started after its change was noted.
    expect(started[0]!.revision).toBeGreaterThanOrEqual(first.revision)
    expect(answers[0]).toEqual({ verdict: started[0]!.evaluation.verdict, stored: true })
    for (const [i, joiner] of joiners.entries()) {
      expect(started[1]!.revision).toBeGreaterThanOrEqual(joiner.revision)
      expect(answers[i + 1]!.verdict).toBe(started[1]!.evaluation.verdict)
    }
    // The second read every test saved; it is the one stored.
    expect(started[1]!.evaluation.verdict).toEqual(engineNow(tankId))
    expect(storedVerdict(tankId)).toEqual(engineNow(tankId))
  })

  it('never answers a change with an evaluation that was already running when it was noted', async () => {
    const tankId = demo.tanks.nano
    const { started, evaluate } = heldEvaluations()
    const a = saveAndRefresh(tankId, evaluate)
    const b = saveAndRefresh(tankId, evaluate)
    started[0]!.finish()
    await settle()
    // b's evaluation is running: c waits for the one after it.
    const c = saveAndRefresh(tankId, evaluate)
    started[1]!.finish()
    await settle()
    expect(started).toHaveLength(3)
    started[2]!.finish()
    const answers = await Promise.all([a.answer, b.answer, c.answer])
    expect(started.map(s => s.revision)).toEqual([a.revision, b.revision, c.revision])
    expect(answers.map(x => x?.verdict)).toEqual(started.map(s => s.evaluation.verdict))
    expect(answers[1]!.verdict).not.toEqual(answers[2]!.verdict)
    expect(storedVerdict(tankId)).toEqual(engineNow(tankId))
  })

  it('makes a joined evaluation as of the latest time among its joiners', async () => {
    const tankId = demo.tanks.study
    const { started, evaluate } = heldEvaluations()
    const first = saveAndRefresh(tankId, evaluate, now)
    const later = saveAndRefresh(tankId, evaluate, minutes(5))
    const earlier = saveAndRefresh(tankId, evaluate, minutes(-5))
    expect(started[0]!.now).toEqual(now)
    started[0]!.finish()
    await settle()
    expect(started[1]!.now).toEqual(minutes(5))
    started[1]!.finish()
    await Promise.all([first.answer, later.answer, earlier.answer])
    expect(storedRow(tankId)?.evaluatedAt).toBe(minutes(5).toISOString())
  })

  it('hands the pool the tests saved meanwhile, which its kept copy places in turn instead of reading the history again', () => {
    const tankId = demo.tanks.study
    const pool = workerConnection(dbPath)
    tankVerdict({ dbPath, tankId, nowMs: now.getTime(), appended: [] })
    const before = keptHistory(pool, tankId)
    // As a thread receives them: copies.
    const list = [saveTest(tankId), saveTest(tankId), saveTest(tankId)].map(s => structuredClone(s.appended))
    expect(tankVerdict({ dbPath, tankId, nowMs: now.getTime(), appended: list })?.verdict).toEqual(engineNow(tankId))
    const after = keptHistory(pool, tankId)
    expect(after.tests).toBe(before.tests + 3)
    // The same events array: the copy took the tests in place; a read of the history makes a new one.
    expect(after.history.events).toBe(before.history.events)

    // A change among them that was not a save breaks the chain: the copy is dropped and the history read again.
    const edited = saveTest(tankId)
    db.update(readings).set({ nitrateN: 9 }).where(eq(readings.id, edited.appended.row.id)).run()
    const next = saveTest(tankId)
    expect(tankVerdict({ dbPath, tankId, nowMs: now.getTime(), appended: [edited.appended, next.appended].map(a => structuredClone(a)) })?.verdict).toEqual(engineNow(tankId))
    expect(keptHistory(pool, tankId).history.events).not.toBe(before.history.events)
  })

  it('stores a result only when it was made from data at least as new as the stored verdict\'s', () => {
    const tankId = demo.tanks.lobby
    noteTankDataChanged(tankId)
    const olderRevision = tankDataRevision(tankId)
    const older = evaluateTankNow(db, tankId, now)!
    const newerRevision = saveTest(tankId).revision
    const newer = evaluateTankNow(db, tankId, now)!
    expect(older.verdict).not.toEqual(newer.verdict)
    expect(storeVerdictIfNewer(db, tankId, newer, now, newerRevision)).toBe(true)
    expect(storeVerdictIfNewer(db, tankId, older, minutes(1), olderRevision)).toBe(false)
    expect(storedVerdict(tankId)).toEqual(newer.verdict)
    // Made from the same data: stored (a later time).
    expect(storeVerdictIfNewer(db, tankId, newer, minutes(1), newerRevision)).toBe(true)
    expect(storedRow(tankId)?.evaluatedAt).toBe(minutes(1).toISOString())
  })

  it('does not store the pool\'s result over a newer verdict the request loop stored meanwhile', async () => {
    const tankId = demo.tanks.lounge
    const { started, evaluate } = heldEvaluations()
    const first = saveAndRefresh(tankId, evaluate)
    const queued = saveAndRefresh(tankId, evaluate)
    // The tank falls back under LONG_HISTORY_TESTS (a delete): the next change is evaluated on the loop, at once.
    saveTest(tankId)
    expect(refreshVerdictOnLoop(db, tankId, now)?.stored).toBe(true)
    const newest = storedVerdict(tankId)
    expect(newest).toEqual(engineNow(tankId))
    started[0]!.finish()
    const older = await first.answer
    // Its caller has the verdict that includes its change, but it is not the stored one.
    expect(older).toEqual({ verdict: started[0]!.evaluation.verdict, stored: false })
    expect(older!.verdict).not.toEqual(newest)
    expect(storedVerdict(tankId)).toEqual(newest)
    // The queued evaluation started after the loop's store, from data at least as new: stored.
    await settle()
    started[1]!.finish()
    expect((await queued.answer)?.stored).toBe(true)
    expect(storedVerdict(tankId)).toEqual(engineNow(tankId))
  })

  it('does not store a verdict older than a test saved and refreshed on the loop while the worker evaluated', async () => {
    const tankId = demo.tanks.nano
    let before: Verdict | null = null
    let raced = false
    noteTankDataChanged(tankId)
    const refreshed = await refreshVerdictOffLoop(db, tankId, async (id, at, appended) => {
      const evaluation = tankVerdict({ dbPath, tankId: id, nowMs: at.getTime(), appended })
      if (!raced) {
        raced = true
        before = evaluation?.verdict ?? null
        saveTest(tankId)
        refreshVerdictOnLoop(db, tankId, now)
      }
      return evaluation
    }, () => now)
    expect(refreshed?.stored).toBe(false)
    // The saved test changes what the engine says, so an older verdict stored over it would show.
    expect(before).not.toEqual(engineNow(tankId))
    expect(storedVerdict(tankId)).toEqual(engineNow(tankId))
  })

  it('rejects every joiner of an evaluation that fails, and goes on with the changes after it', async () => {
    const tankId = demo.tanks.study
    const { started, evaluate } = heldEvaluations()
    const first = saveAndRefresh(tankId, evaluate)
    const joiners = [saveAndRefresh(tankId, evaluate), saveAndRefresh(tankId, evaluate)]
    const stopped = new Error('the pool thread stopped')
    started[0]!.fail(stopped)
    await expect(first.answer).rejects.toBe(stopped)
    // The queued evaluation starts all the same.
    await settle()
    expect(started).toHaveLength(2)
    const again = new Error('the pool thread stopped again')
    started[1]!.fail(again)
    await Promise.all(joiners.map(j => expect(j.answer).rejects.toBe(again)))
    // Nothing is left waiting: the next change starts at once and is stored.
    const later = saveAndRefresh(tankId, evaluate)
    expect(started).toHaveLength(3)
    started[2]!.finish()
    expect((await later.answer)?.stored).toBe(true)
    expect(storedVerdict(tankId)).toEqual(engineNow(tankId))

    // An evaluation that cannot even start (it throws at once) rejects too, and clears the way.
    const refused = new Error('no pool')
    await expect(saveAndRefresh(tankId, () => {
      throw refused
    }).answer).rejects.toBe(refused)
    const after = saveAndRefresh(tankId, evaluate)
    expect(started).toHaveLength(4)
    started[3]!.finish()
    expect((await after.answer)?.stored).toBe(true)
  })

  it('waits for another connection\'s write lock to store the verdict without holding the loop, then stores it', async () => {
    const tankId = demo.tanks.lobby
    const { started, evaluate } = heldEvaluations()
    const { answer } = saveAndRefresh(tankId, evaluate)
    // Another connection holds the write lock, as the pool's import does for most of a second.
    const other = new Database(dbPath)
    other.exec('BEGIN IMMEDIATE')
    let answered = false
    const settled = answer.then((refreshed) => {
      answered = true
      return refreshed
    })
    started[0]!.finish()
    // The loop turns (other companies' requests would be served) while the store waits.
    for (let turn = 0; turn < 50; turn++) await settle()
    expect(answered).toBe(false)
    other.exec('COMMIT')
    other.close()
    expect(await settled).toEqual({ verdict: started[0]!.evaluation.verdict, stored: true })
    expect(storedVerdict(tankId)).toEqual(started[0]!.evaluation.verdict)
  })
})
