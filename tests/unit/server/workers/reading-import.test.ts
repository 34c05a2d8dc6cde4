/**
 * The CSV import in the worker stages the file's rows (a chunk at a time, no write lock) and
 * then writes them in one short transaction: a dry run must say exactly what the write then
 * does (rows repeated in the file, rows the tank already holds, a day with little room left,
 * refused rows), a test saved on another connection between staging and writing must still
 * take its day's room first, a row imported meanwhile is a duplicate, a file past the row cap
 * must leave nothing behind, and the audit row commits with the rows; repeats and rows imported
 * meanwhile count the same in a tank that holds no imported tests yet, and a file longer than
 * the slices the write copies it in is written whole, in file order. Real migrated SQLite file with the demo company; the worker's function is
 * called directly.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { and, eq, isNotNull } from 'drizzle-orm'
import * as v from 'valibot'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../../../server/db/connection'
import { auditLog, readings } from '../../../../server/db/schema'
import { seedDemo, type DemoIds } from '../../../../server/db/seed/demo'
import { IdParams } from '../../../../shared/schemas/common'
import { IMPORT_CHUNK_ROWS } from '../../../../shared/readings/import-plan'
import { MAX_IMPORT_ROWS, TESTS_PER_TANK_PER_DAY } from '../../../../shared/readings/limits'
import { workerConnection } from '../../../../server/workers/connection'
import { commitStaged, dropStage, PUBLISH_SLICE_LINES, readingImport, stageImport, type ReadingImportTask } from '../../../../server/workers/reading-import'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-import-'))
const dbPath = join(dir, 'import.sqlite')
let db: TidewrightDB
let demo: DemoIds
const now = new Date()

beforeAll(async () => {
  db = openDatabase(dbPath)
  migrateDatabase(db)
  demo = await seedDemo(db, now)
})
afterAll(() => {
  db?.$client.close()
  rmSync(dir, { recursive: true, force: true })
})

const countOn = (tankId: string) => db.select().from(readings).where(eq(readings.tankId, tankId)).all().length
/** Readings of the tank that carry an import key. */
const importedIn = (tankId: string) => db.select().from(readings).where(and(eq(readings.tankId, tankId), isNotNull(readings.importKey))).all().length
const importAudits = (tankId: string) => db.select().from(auditLog).where(and(eq(auditLog.action, 'reading.import'), eq(auditLog.entityId, tankId))).all().length

function task(tankId: string, csv: string, dryRun: boolean): ReadingImportTask {
  return {
    dbPath,
    tankId,
    actor: { id: demo.users.aquarist, organisationId: demo.organisationId },
    input: { mapping: {}, temperatureUnit: 'C', salinityMode: 'practical', dryRun },
    file: { text: csv },
    kit: { ammonia: 'N', nitrite: 'N', nitrate: 'N' },
    lockedMs: null,
    nowMs: now.getTime(),
  }
}

const run = (tankId: string, csv: string, dryRun: boolean) => readingImport(task(tankId, csv, dryRun))

/** A test saved on the test's own connection (not the worker's), as another request would. */
const saveElsewhere = (tankId: string, takenAt: string, ammoniaN: number) =>
  db.insert(readings).values({ tankId, takenAt, ammoniaN, entered: {} }).run()

/** Stages the file, lets `meanwhile` run (another connection), then writes what was staged. */
function stageThenWrite(t: ReadingImportTask, meanwhile: () => void) {
  const { outcome, db: workerDb, stage } = stageImport(t)
  try {
    if (outcome.kind !== 'plan') throw new Error(outcome.kind)
    meanwhile()
    const written = commitStaged(t, workerDb, stage, outcome.plan)
    if (!written) throw new Error('lock moved')
    return { plan: outcome.plan, inserted: written.inserted }
  }
  finally {
    dropStage(workerDb)
  }
}

/** `count` tests a minute apart from `start`, ammonia stepping so each row is its own test. */
const minutely = (count: number, start: number) =>
  Array.from({ length: count }, (_, i) => `${new Date(start + i * 60_000).toISOString()},${(i % 400) / 100},0,5`)

describe('the CSV import in the worker', () => {
  it('says on a dry run exactly what the write then does, across chunks', () => {
    const tankId = demo.tanks.study
    // A day far from the seed's tests: only this file fills it.
    const day = Date.parse(new Date(now.getTime() - 400 * 86_400_000).toISOString().slice(0, 10))
    const first = minutely(TESTS_PER_TANK_PER_DAY - 5, day)
    const held = run(tankId, ['takenAt,ammonia,nitrite,nitrate', ...first].join('\n'), false)
    expect(held.kind === 'done' && held.preview.inserted).toBe(TESTS_PER_TANK_PER_DAY - 5)

    // Past the first chunk: the rows already held, a repeat within the file, a refused row, and
    // ten new tests on a day with room for five.
    const filler = Array.from({ length: IMPORT_CHUNK_ROWS }, (_, i) => `${new Date(day - (1100 + i) * 86_400_000).toISOString()},0.2,0,5`)
    const fresh = minutely(10, day + 12 * 3_600_000)
    const rows = [...filler, ...first, fresh[0]!, 'not a date,0,0,5', ...fresh]
    const csv = ['takenAt,ammonia,nitrite,nitrate', ...rows].join('\n')
    const dry = run(tankId, csv, true)
    const before = countOn(tankId)
    const wet = run(tankId, csv, false)
    if (dry.kind !== 'done' || wet.kind !== 'done') throw new Error(`${dry.kind} ${wet.kind}`)
    const { dryRun: _d, inserted: _i, ...dryAnswer } = dry.preview
    const { dryRun: _w, inserted, ...wetAnswer } = wet.preview
    expect(wetAnswer).toEqual(dryAnswer)
    expect(inserted).toBe(wet.preview.valid)
    expect(countOn(tankId) - before).toBe(inserted)
    // The held rows and the repeat are duplicates, not refusals; the day takes five of the ten.
    expect([wet.preview.rows, wet.preview.valid, wet.preview.duplicates, wet.preview.errorRows]).toEqual([rows.length, IMPORT_CHUNK_ROWS + 5, TESTS_PER_TANK_PER_DAY - 5 + 1, 6])
    const dayFull = wet.preview.errors.filter(e => e.field === 'takenAt' && e.message.includes('the most one day may hold'))
    expect(dayFull.length).toBe(5)
    expect(wet.preview.errors.map(e => e.row)).toEqual([...wet.preview.errors.map(e => e.row)].sort((a, b) => a - b))
  })

  it('counts a test saved on another connection between staging and writing against the day, and refuses the row that would pass the cap', () => {
    const tankId = demo.tanks.study
    const day = Date.parse(new Date(now.getTime() - 500 * 86_400_000).toISOString().slice(0, 10))
    const rows = minutely(TESTS_PER_TANK_PER_DAY, day)
    const csv = ['takenAt,ammonia,nitrite,nitrate', ...rows].join('\n')
    const before = countOn(tankId)
    const audits = importAudits(tankId)
    // Staging sees an empty day and takes all 48; a save lands on the day before the write.
    const { plan, inserted } = stageThenWrite(task(tankId, csv, false), () => saveElsewhere(tankId, new Date(day + 23 * 3_600_000).toISOString(), 0.3))
    expect(inserted).toBe(TESTS_PER_TANK_PER_DAY - 1)
    expect(countOn(tankId) - before).toBe(TESTS_PER_TANK_PER_DAY)
    expect([plan.added, plan.duplicates, plan.errorCount]).toEqual([TESTS_PER_TANK_PER_DAY - 1, 0, 1])
    // The file's last row of the day is the one refused, reported by its row number (header is row 1).
    expect(plan.errors).toEqual([{ row: TESTS_PER_TANK_PER_DAY + 1, field: 'takenAt', message: expect.stringContaining('the most one day may hold') }])
    expect(plan.preview.every(p => p.row !== TESTS_PER_TANK_PER_DAY + 1)).toBe(true)
    expect(importAudits(tankId)).toBe(audits + 1)
  })

  it('counts a row of the file imported on another connection meanwhile as a duplicate, written once', () => {
    const tankId = demo.tanks.study
    const day = Date.parse(new Date(now.getTime() - 600 * 86_400_000).toISOString().slice(0, 10))
    const csv = ['takenAt,ammonia,nitrite,nitrate', ...minutely(3, day)].join('\n')
    const before = countOn(tankId)
    // Another import of the same file commits on another connection between this one's staging
    // and its write: the same tests, under the same import keys.
    const { plan, inserted } = stageThenWrite(task(tankId, csv, false), () => {
      const staged = workerConnection(dbPath).$client.prepare('SELECT taken_at AS takenAt, ammonia_n AS ammoniaN, import_key AS importKey FROM temp.import_stage').all() as { takenAt: string, ammoniaN: number, importKey: string }[]
      expect(staged.length).toBe(3)
      for (const row of staged) db.insert(readings).values({ tankId, ...row, entered: {} }).run()
    })
    expect(inserted).toBe(0)
    expect([plan.added, plan.duplicates, plan.errorCount]).toEqual([0, 3, 0])
    expect(countOn(tankId) - before).toBe(3)
  })

  it('counts repeats within the file as duplicates in a tank that holds no imported tests yet, on a day with room and on a full one', () => {
    const tankId = demo.tanks.lounge
    expect(importedIn(tankId)).toBe(0)
    const day = Date.parse(new Date(now.getTime() - 700 * 86_400_000).toISOString().slice(0, 10))
    const tests = minutely(TESTS_PER_TANK_PER_DAY + 1, day)
    // A repeat while the day has room, the day filled, a repeat once it is full, then a new test it has no room for.
    const rows = [...tests.slice(0, 10), tests[0]!, ...tests.slice(10, TESTS_PER_TANK_PER_DAY), tests[1]!, tests[TESTS_PER_TANK_PER_DAY]!]
    const csv = ['takenAt,ammonia,nitrite,nitrate', ...rows].join('\n')
    const dry = run(tankId, csv, true)
    const wet = run(tankId, csv, false)
    if (dry.kind !== 'done' || wet.kind !== 'done') throw new Error(`${dry.kind} ${wet.kind}`)
    for (const answer of [dry.preview, wet.preview]) {
      expect([answer.rows, answer.valid, answer.duplicates, answer.errorRows]).toEqual([rows.length, TESTS_PER_TANK_PER_DAY, 2, 1])
      expect(answer.errors).toEqual([{ row: rows.length + 1, field: 'takenAt', message: expect.stringContaining('the most one day may hold') }])
    }
    expect(wet.preview.inserted).toBe(TESTS_PER_TANK_PER_DAY)
    expect(importedIn(tankId)).toBe(TESTS_PER_TANK_PER_DAY)
    // The same file again: every test it holds is a duplicate, the day still refuses the new one.
    const again = run(tankId, csv, false)
    if (again.kind !== 'done') throw new Error(again.kind)
    expect([again.preview.inserted, again.preview.duplicates, again.preview.errorRows]).toEqual([0, rows.length - 1, 1])
  })

  it('counts a row imported on another connection meanwhile as a duplicate in a tank that held no imported tests when staging began', () => {
    const tankId = demo.tanks.nano
    expect(importedIn(tankId)).toBe(0)
    const day = Date.parse(new Date(now.getTime() - 800 * 86_400_000).toISOString().slice(0, 10))
    const csv = ['takenAt,ammonia,nitrite,nitrate', ...minutely(3, day)].join('\n')
    const { plan, inserted } = stageThenWrite(task(tankId, csv, false), () => {
      const staged = workerConnection(dbPath).$client.prepare('SELECT taken_at AS takenAt, ammonia_n AS ammoniaN, import_key AS importKey FROM temp.import_stage ORDER BY line LIMIT 2').all() as { takenAt: string, ammoniaN: number, importKey: string }[]
      for (const row of staged) db.insert(readings).values({ tankId, ...row, entered: {} }).run()
    })
    expect(inserted).toBe(1)
    expect([plan.added, plan.duplicates, plan.errorCount]).toEqual([1, 2, 0])
    expect(importedIn(tankId)).toBe(3)
  })

  it('leaves nothing behind for a file past the row cap, though its first chunks were staged', () => {
    const tankId = demo.tanks.lobby
    const before = countOn(tankId)
    const audits = importAudits(tankId)
    const start = now.getTime() - 19 * 365 * 86_400_000
    const rows = Array.from({ length: MAX_IMPORT_ROWS + 1 }, (_, i) => `${new Date(start + i * 1_800_000).toISOString()},0.1,0,5`)
    expect(run(tankId, ['takenAt,ammonia,nitrite,nitrate', ...rows].join('\n'), false).kind).toBe('too-many-rows')
    expect(countOn(tankId)).toBe(before)
    expect(importAudits(tankId)).toBe(audits)
  })

  it('answers the same for a file read from disk in pieces as for its text, notes spanning lines and characters of several bytes included', () => {
    const tankId = demo.tanks.study
    const start = now.getTime() - 900 * 86_400_000
    // Longer than several of the reader's pieces; every ninth note is quoted and spans lines (CRLF file).
    const rows = Array.from({ length: 3000 }, (_, i) => `${new Date(start + i * 3_600_000).toISOString()},${(i % 40) / 10},0,5,${i % 9 ? `Wasserwechsel ${i} µS 🐠` : `"Kalk ""hoch"",\r\nnach dem Wechsel ${i}"`}`)
    const csv = `\uFEFF${['takenAt,ammonia,nitrite,nitrate,notes', ...rows, 'not a date,0,0,5,x'].join('\r\n')}\r\n`
    const path = join(dir, 'upload.csv')
    writeFileSync(path, csv)
    const fromText = readingImport({ ...task(tankId, csv, true), file: { text: csv } })
    const fromFile = readingImport({ ...task(tankId, csv, true), file: { path } })
    if (fromText.kind !== 'done') throw new Error(fromText.kind)
    expect(fromText.preview).toMatchObject({ rows: 3001, valid: 3000, errorRows: 1 })
    expect(fromFile).toEqual(fromText)
  })

  it('writes every row of a file longer than one slice of the write, in file order, with refused rows and repeats across the slices', () => {
    const tankId = demo.tanks.lounge
    const start = now.getTime() - 1500 * 86_400_000
    // Hourly (24 a day); every 1,000th row is refused and every 700th repeats the row before it,
    // so the staged lines have gaps, some at a slice's edge.
    const lines: string[] = []
    const written: string[] = []
    for (let i = 0; lines.length < 2 * PUBLISH_SLICE_LINES + 100; i++) {
      const takenAt = new Date(start + i * 3_600_000).toISOString()
      if (i % 1000 === 999) lines.push('not a date,0.1,0,5')
      else if (i % 700 === 699) lines.push(lines.at(-1)!)
      else {
        lines.push(`${takenAt},${(i % 400) / 100},0,5`)
        written.push(takenAt)
      }
    }
    const before = importedIn(tankId)
    const result = run(tankId, ['takenAt,ammonia,nitrite,nitrate', ...lines].join('\n'), false)
    if (result.kind !== 'done') throw new Error(result.kind)
    expect(result.preview).toMatchObject({ rows: lines.length, valid: written.length, inserted: written.length })
    expect(importedIn(tankId) - before).toBe(written.length)
    const stored = db.$client.prepare('SELECT taken_at FROM readings WHERE tank_id = ? AND import_key IS NOT NULL ORDER BY rowid').pluck().all(tankId) as string[]
    expect(stored.slice(before)).toEqual(written)
  })

  it('gives the rows it writes ids that follow the file order, each a UUID, so the primary key index takes them at one place', () => {
    const tankId = demo.tanks.lobby
    const start = now.getTime() - 2000 * 86_400_000
    const lines = Array.from({ length: PUBLISH_SLICE_LINES + 10 }, (_, i) => `${new Date(start + i * 3_600_000).toISOString()},${(i % 400) / 100},0,5`)
    const before = importedIn(tankId)
    const result = run(tankId, ['takenAt,ammonia,nitrite,nitrate', ...lines].join('\n'), false)
    if (result.kind !== 'done') throw new Error(result.kind)
    const ids = (db.$client.prepare('SELECT id FROM readings WHERE tank_id = ? AND import_key IS NOT NULL ORDER BY rowid').pluck().all(tankId) as string[]).slice(before)
    expect(ids.length).toBe(lines.length)
    expect(ids.every(id => v.is(IdParams.entries.id, id))).toBe(true)
    expect(ids).toEqual([...ids].sort())
    expect(new Set(ids).size).toBe(ids.length)
  })

  it('writes the audit row with the rows', () => {
    const tankId = demo.tanks.lobby
    const audits = importAudits(tankId)
    const result = run(tankId, ['takenAt,ammonia,nitrite,nitrate', `${new Date(now.getTime() - 3_600_000).toISOString()},0.5,0,5`].join('\n'), false)
    expect(result.kind === 'done' && result.preview.inserted).toBe(1)
    expect(importAudits(tankId)).toBe(audits + 1)
  })
})
