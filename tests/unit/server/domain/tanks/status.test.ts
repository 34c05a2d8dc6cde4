/**
 * changeTankStatus against a real migrated SQLite file: the lifecycle table decides, the
 * status and its audit row are written together, and no other server code writes a status.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../../../../server/db/connection'
import { auditLog, clients, organisations, tanks, users } from '../../../../../server/db/schema'
import { changeTankStatus, TankStatusRefused } from '../../../../../server/domain/tanks/status'
import type { TankStatus } from '../../../../../shared/vocabulary'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-status-'))
let db: TidewrightDB
let organisationId: string
let clientId: string
let aquarist: { id: string, organisationId: string, role: 'aquarist' }
let supervisor: { id: string, organisationId: string, role: 'supervisor' }

beforeAll(() => {
  db = openDatabase(join(dir, 'status.sqlite'))
  migrateDatabase(db)
  organisationId = db.insert(organisations).values({ name: 'Kelpwater Installations' }).returning().get().id
  clientId = db.insert(clients).values({ organisationId, name: 'Orla Penhallow' }).returning().get().id
  const person = (role: 'aquarist' | 'supervisor', email: string) => db.insert(users).values({ organisationId, email, name: email, role }).returning().get().id
  aquarist = { id: person('aquarist', 'aquarist@kelpwater.test'), organisationId, role: 'aquarist' }
  supervisor = { id: person('supervisor', 'supervisor@kelpwater.test'), organisationId, role: 'supervisor' }
})
afterAll(() => {
  db?.$client.close()
  rmSync(dir, { recursive: true, force: true })
})

const tankIn = (status: TankStatus) => db.insert(tanks).values({ organisationId, clientId, name: `A ${status} tank`, volumeLitres: 200, status }).returning().get()
const statusOf = (id: string) => db.select({ status: tanks.status }).from(tanks).where(eq(tanks.id, id)).get()?.status
const auditOf = (id: string) => db.select().from(auditLog).where(eq(auditLog.entityId, id)).all()

describe('changeTankStatus', () => {
  it('moves the tank and writes one audit row naming the trigger', () => {
    const tank = tankIn('building')
    const after = changeTankStatus(db, { tankId: tank.id, trigger: 'water-filled', actor: aquarist, cycleStartedAt: '2026-11-02T09:00:00.000Z' })
    expect(after).toMatchObject({ status: 'cycling', cycleStartedAt: '2026-11-02T09:00:00.000Z' })
    expect(statusOf(tank.id)).toBe('cycling')
    const rows = auditOf(tank.id)
    expect(rows).toHaveLength(1)
    expect(rows[0]).toMatchObject({ action: 'tank.status', actorId: aquarist.id, organisationId, before: { status: 'building', cycleStartedAt: null }, after: { status: 'cycling', trigger: 'water-filled' } })
  })

  it('refuses what the table refuses and writes nothing', () => {
    const tank = tankIn('cycling')
    expect(() => changeTankStatus(db, { tankId: tank.id, trigger: 'stocking-started', actor: aquarist })).toThrow(TankStatusRefused)
    expect(() => changeTankStatus(db, { tankId: tank.id, trigger: 'sign-off-requested', actor: supervisor })).toThrow(/Only admin or aquarist/)
    expect(statusOf(tank.id)).toBe('cycling')
    expect(auditOf(tank.id)).toEqual([])
  })

  it('records Tidewright\'s own changes without a person', () => {
    const tank = tankIn('signed-off')
    changeTankStatus(db, { tankId: tank.id, trigger: 'livestock-logged', actor: null })
    expect(statusOf(tank.id)).toBe('stocking')
    expect(auditOf(tank.id)[0]).toMatchObject({ actorId: null, after: { status: 'stocking', trigger: 'livestock-logged' } })
  })

  it('runs inside the caller\'s transaction: when the caller fails, neither status nor audit row stays', () => {
    const tank = tankIn('cycled')
    expect(() => db.transaction((tx) => {
      changeTankStatus(tx, { tankId: tank.id, trigger: 'sign-off-approved', actor: supervisor })
      throw new Error('the decision could not be stored')
    })).toThrow(/could not be stored/)
    expect(statusOf(tank.id)).toBe('cycled')
    expect(auditOf(tank.id)).toEqual([])
  })

  it('refuses a tank that does not exist', () => {
    expect(() => changeTankStatus(db, { tankId: crypto.randomUUID(), trigger: 'stage-started', actor: aquarist })).toThrow(/not found/)
  })
})

function sourceFiles(root: string): string[] {
  return readdirSync(root).flatMap((name) => {
    const path = join(root, name)
    return statSync(path).isDirectory() ? sourceFiles(path) : /\.ts$/.test(name) ? [path] : []
  })
}

describe('the server', () => {
  it('writes a tank\'s status only through changeTankStatus', () => {
    const writes = /\.update\(\s*tanks\s*\)\s*\.set\(\s*\{[^}]*\bstatus\s*:/
    const writers = sourceFiles('server').filter(file => !file.includes(join('db', 'seed')) && writes.test(readFileSync(file, 'utf8')))
    expect(writers).toEqual([join('server', 'domain', 'tanks', 'status.ts')])
    expect(writes.test(`db.update(tanks).set({ status: 'stocking' })`)).toBe(true)
  })
})
