/**
 * The verdict refresh reads a tank's current readings through a lean query (`tankEngineReadings`)
 * instead of the full rows with their trail. It must be the same rows, in the same order, with
 * the same values as the current rows of `tankReadings`: corrected rows left out, same-minute
 * tests in entry order.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { eq } from 'drizzle-orm'
import { afterAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase } from '../../../server/db/connection'
import { readings } from '../../../server/db/schema'
import { seedDemo } from '../../../server/db/seed/demo'
import { ENGINE_READING_COLUMNS, engineValuesOf, latestChartReadings, readingHistoryPage, tankEngineReadings, tankReadings } from '../../../server/domain/readings/current'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-engine-readings-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('the readings a verdict is made from', () => {
  it('are the current readings of the tank, in history order, with every value the engine reads', async () => {
    const db = openDatabase(join(dir, 'demo.sqlite'))
    migrateDatabase(db)
    const now = new Date()
    const ids = await seedDemo(db, now)
    const tankId = ids.tanks.nano
    const [first, second] = tankReadings(db, tankId)
    // A correction of the first reading, and two tests in the same minute entered apart.
    db.insert(readings).values({ tankId, takenAt: first!.takenAt, ammoniaN: 0.25, nitriteN: 0, entered: {}, correctsId: first!.id, correctionReason: 'misread', createdAt: now.toISOString(), updatedAt: now.toISOString() }).run()
    db.insert(readings).values({ tankId, takenAt: second!.takenAt, ammoniaN: 1, entered: {}, createdAt: new Date(now.getTime() + 1000).toISOString(), updatedAt: now.toISOString() }).run()
    const full = tankReadings(db, tankId)
    const lean = [...tankEngineReadings(db, tankId)]
    // Read one row at a time on the handle's connection, inside a transaction too.
    expect(db.transaction(tx => [...tankEngineReadings(tx, tankId)])).toEqual(lean)
    expect(lean.map(([id]) => id)).not.toContain(first!.id)
    const keys = Object.keys(ENGINE_READING_COLUMNS) as (keyof typeof ENGINE_READING_COLUMNS)[]
    expect(lean).toEqual(full.map(row => keys.map(key => row[key])))
    expect(full.map(engineValuesOf)).toEqual(lean)
    // The connection streams the rows; a transaction (a sign-off, the seed) reads them as one list: the same rows.
    expect(db.transaction(tx => [...tankEngineReadings(tx, tankId)])).toEqual(lean)

    // The chart's read: the latest current readings, oldest first, and whether there are older ones.
    const charted = (r: (typeof full)[number]) => [r.takenAt, r.ammoniaN, r.nitriteN, r.nitrateN, r.pH, r.temperatureC, r.salinity]
    const latest = latestChartReadings(db, tankId, {}, 3)
    expect(latest).toEqual({ rows: full.slice(-3).map(charted), older: true })
    const range = { from: full[1]!.takenAt, to: full.at(-2)!.takenAt }
    const inRange = tankReadings(db, tankId, { range })
    expect(latestChartReadings(db, tankId, range, 2)).toEqual({ rows: inRange.slice(-2).map(charted), older: inRange.length > 2 })
    expect(latestChartReadings(db, tankId, {}, full.length)).toEqual({ rows: full.map(charted), older: false })
    db.$client.close()
  })

  it('are counted for a history page as the database holds them, a write on another connection included', async () => {
    const path = join(dir, 'counts.sqlite')
    const db = openDatabase(path)
    migrateDatabase(db)
    const ids = await seedDemo(db, new Date())
    const other = openDatabase(path)
    const tankId = ids.tanks.nano
    const page = () => readingHistoryPage(db, tankId, {}, { sort: readings.takenAt, dir: 'desc', page: 1, pageSize: 5 }).total
    const stored = () => (db.$client.prepare('select count(*) as n from readings where tank_id = ?').get(tankId) as { n: number }).n
    expect(page()).toBe(stored())
    expect(page()).toBe(stored())
    other.insert(readings).values({ tankId, takenAt: new Date().toISOString(), nitrateN: 4, entered: {} }).run()
    expect(page()).toBe(stored())
    const [latest] = tankReadings(db, tankId).slice(-1)
    db.delete(readings).where(eq(readings.id, latest!.id)).run()
    expect(page()).toBe(stored())
    other.$client.close()
    db.$client.close()
  })
})
