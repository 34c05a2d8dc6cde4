/**
 * After a CSV import the verdict is evaluated in a worker thread, on its own connection, while
 * the request loop goes on serving. A test saved on the same tank in that time refreshes the
 * verdict at once; the worker's answer, made from the data before that test, must then not be
 * stored over it. Real migrated SQLite file with the demo company; the worker's function is
 * called directly, and the test is saved between its read and the store.
 */
import { randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../../shared/cycle/engine'
import { forecastCycle } from '../../../../../shared/cycle/forecast'
import type { Verdict } from '../../../../../shared/cycle/types'
import { readings, tankVerdicts } from '../../../../../server/db/schema'
import { computeAndStoreVerdict, cycleInputFor } from '../../../../../server/db/verdicts'
import { noteTankDataChanged, refreshVerdictOffLoop } from '../../../../../server/domain/tanks/verdict-off-loop'
import { tankVerdict } from '../../../../../server/workers/tank-verdict'
import { seededDatabase } from '../../../../support/seeded-database'

const { db, dbPath, demo, now } = await seededDatabase('verdict-off-loop')

const storedVerdict = (tankId: string) => db.select().from(tankVerdicts).where(eq(tankVerdicts.tankId, tankId)).get()?.verdict
const storedForecast = (tankId: string) => db.select().from(tankVerdicts).where(eq(tankVerdicts.tankId, tankId)).get()?.forecast
const engineNow = (tankId: string) => evaluateCycle(cycleInputFor(db, tankId, now)!)

/** What a route does for a test saved by hand: the write, then the verdict refreshed at once. */
function saveTestAndRefresh(tankId: string) {
  db.insert(readings).values({
    id: randomUUID(), tankId, takenAt: new Date(now.getTime() - 60_000).toISOString(), enteredBy: demo.users.aquarist,
    ammoniaN: 3, nitriteN: 2, nitrateN: 5, pH: 8.1, temperatureC: 25, salinity: 35,
  }).run()
  noteTankDataChanged(tankId)
  computeAndStoreVerdict(db, tankId, now)
}

describe('the verdict refreshed off the request loop', () => {
  it('stores the worker\'s verdict when nothing moved', async () => {
    const tankId = demo.tanks.lobby
    const verdict = await refreshVerdictOffLoop(db, tankId, async (id, at) => tankVerdict({ dbPath, tankId: id, nowMs: at.getTime() }), () => now)
    expect(verdict).toEqual(engineNow(tankId))
    expect(storedVerdict(tankId)).toEqual(engineNow(tankId))
    // The forecast lists show is stored with it, made from the same input.
    const input = cycleInputFor(db, tankId, now)!
    expect(storedForecast(tankId)).toEqual(forecastCycle(input, evaluateCycle(input)))
  })

  it('does not store a verdict older than a test saved while the worker evaluated', async () => {
    const tankId = demo.tanks.nano
    let before: Verdict | null = null
    let raced = false
    await refreshVerdictOffLoop(db, tankId, async (id, at) => {
      const evaluation = tankVerdict({ dbPath, tankId: id, nowMs: at.getTime() })
      if (!raced) {
        raced = true
        before = evaluation?.verdict ?? null
        saveTestAndRefresh(tankId)
      }
      return evaluation
    }, () => now)
    // The saved test changes what the engine says, so an older verdict stored over it would show.
    expect(before).not.toEqual(engineNow(tankId))
    expect(storedVerdict(tankId)).toEqual(engineNow(tankId))
  })
})
