/**
 * whenWritable on a real SQLite file, the write lock held by a second connection (as the
 * heavy-work pool's import holds it): the loop keeps turning while the write waits, the write
 * runs once the lock is free, past the bound nothing runs, and a failing work leaves nothing.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { sql } from 'drizzle-orm'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { openDatabase, type TidewrightDB } from '../../../../server/db/connection'
import { whenWritable, WriteWaitExceeded } from '../../../../server/db/write-wait'

let dir: string
let db: TidewrightDB
let other: Database.Database

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tidewright-write-wait-'))
  db = openDatabase(join(dir, 'test.sqlite'))
  db.$client.exec('create table notes (text text not null)')
  other = new Database(join(dir, 'test.sqlite'))
})
afterEach(() => {
  if (other.inTransaction) other.exec('ROLLBACK')
  other.close()
  db.$client.close()
  rmSync(dir, { recursive: true, force: true })
})

const notes = () => db.$client.prepare('select text from notes').pluck().all()
const turnsOfTheLoop = (count: number) => new Promise<void>((resolve) => {
  const turn = (left: number) => (left === 0 ? resolve() : setImmediate(() => turn(left - 1)))
  turn(count)
})

describe('whenWritable', () => {
  it('waits for another connection\'s lock without holding the loop, then writes', async () => {
    other.exec('BEGIN IMMEDIATE')
    let done = false
    const write = whenWritable(db, () => db.$client.prepare('insert into notes values (?)').run('after the lock')).then(() => {
      done = true
    })
    // The loop turns (other requests would be served) while the write waits.
    await turnsOfTheLoop(50)
    expect(done).toBe(false)
    other.exec('COMMIT')
    await write
    expect(notes()).toEqual(['after the lock'])
  })

  it('gives up past the bound without running the work', async () => {
    other.exec('BEGIN IMMEDIATE')
    let ran = false
    await expect(whenWritable(db, () => {
      ran = true
    }, 20)).rejects.toBeInstanceOf(WriteWaitExceeded)
    expect(ran).toBe(false)
    expect(db.$client.inTransaction).toBe(false)
    // The connection's own busy timeout is back as it was.
    expect(db.$client.pragma('busy_timeout', { simple: true })).toBe(5000)
  })

  it('rolls back everything, nested transactions too, when the work throws', async () => {
    await expect(whenWritable(db, () => {
      db.transaction(tx => tx.run(sql`insert into notes values ('inner')`))
      db.$client.prepare('insert into notes values (?)').run('outer')
      throw new Error('refused')
    })).rejects.toThrow('refused')
    expect(notes()).toEqual([])
    await whenWritable(db, () => db.$client.prepare('insert into notes values (?)').run('kept'))
    expect(notes()).toEqual(['kept'])
  })
})
