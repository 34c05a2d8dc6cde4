/**
 * The sign-off commands outside Nitro, on a real migrated SQLite file with the demo company:
 * they take a Db, refuse with SignOffRefused (status and, for a form field, the field), and
 * write the sign-off, the tank's status and the audit rows together.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../../../../server/db/connection'
import { auditLog, signOffs, tanks } from '../../../../../server/db/schema'
import { seedDemo, type DemoIds } from '../../../../../server/db/seed/demo'
import { decideSignOff, reopenSignOff, requestSignOff } from '../../../../../server/domain/sign-off/commands'
import { entryLockRefusal, lockedUntil } from '../../../../../server/domain/sign-off/lock'
import { evaluateForSignOff } from '../../../../../server/domain/sign-off/evaluation'
import { signOffState } from '../../../../../server/domain/sign-off/state'
import { refusalOf } from '../../../../support/sign-off-refusal'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-sign-off-'))
let db: TidewrightDB
let demo: DemoIds
const now = new Date()

beforeAll(async () => {
  db = openDatabase(join(dir, 'sign-off.sqlite'))
  migrateDatabase(db)
  demo = await seedDemo(db, now)
})
afterAll(() => {
  db?.$client.close()
  rmSync(dir, { recursive: true, force: true })
})

const person = (key: keyof DemoIds['users'], role: 'admin' | 'aquarist' | 'supervisor') => ({ id: demo.users[key], organisationId: demo.organisationId, role })
const tankRow = (id: string) => db.select().from(tanks).where(eq(tanks.id, id)).get()!
/** The tank evaluated as of `now`, as the glue hands it to a command. */
const evaluated = (id: string) => evaluateForSignOff(db, id, now)!

describe('sign-off commands on a Db', () => {
  it('refuses a request from someone who may not manage the tank (403) and a second request while one waits (409)', () => {
    const nano = tankRow(demo.tanks.nano)
    expect(refusalOf(() => requestSignOff(db, person('supervisor', 'supervisor'), nano, '', false, evaluated(nano.id))).status).toBe(403)
    expect(refusalOf(() => requestSignOff(db, person('aquarist', 'aquarist'), nano, '', true, evaluated(nano.id)))).toMatchObject({ status: 409, message: expect.stringContaining('already waiting') })
  })

  it('refuses a decision by an aquarist (403) and reopening with nothing approved (409)', () => {
    const nano = tankRow(demo.tanks.nano)
    expect(refusalOf(() => decideSignOff(db, person('aquarist', 'aquarist'), nano, 'approve', '', evaluated(nano.id))).status).toBe(403)
    expect(refusalOf(() => reopenSignOff(db, person('supervisor', 'supervisor'), nano, 'Check again', now)).status).toBe(409)
  })

  it('approves the waiting request with a code, signs the tank off and locks its record, audit rows included', () => {
    const decided = decideSignOff(db, person('supervisor', 'supervisor'), tankRow(demo.tanks.nano), 'approve', 'Cycle proven.', evaluated(demo.tanks.nano))
    expect(decided.verificationCode).toMatch(/^TW-(?:[0-9A-Z]{4}-){5}[0-9A-Z]{4}$/)
    expect(decided.signOff).toMatchObject({ status: 'approved', decidedBy: demo.users.supervisor, override: false })
    expect(tankRow(demo.tanks.nano).status).toBe('signed-off')
    const actions = db.select({ action: auditLog.action }).from(auditLog).where(eq(auditLog.entityId, decided.signOff.id)).all().map(r => r.action)
    expect(actions).toEqual(['sign-off.approve'])
    expect(lockedUntil(db, demo.tanks.nano)).toBe(decided.signOff.decidedAt)
    expect(entryLockRefusal(db, demo.tanks.nano, new Date(now.getTime() - 60_000))?.message).toMatch(/signed off on/)
    expect(entryLockRefusal(db, demo.tanks.nano, new Date(now.getTime() + 60_000))).toBeNull()
    const state = signOffState(db, person('supervisor', 'supervisor'), tankRow(demo.tanks.nano), false, evaluated(demo.tanks.nano).verdict)
    expect(state).toMatchObject({ tankStatus: 'signed-off', canReopen: true, canDecide: false, hasCertificate: true })
  })

  it('reopens with a reason: the record unlocks and the tank goes back to cycling', () => {
    const row = reopenSignOff(db, person('admin', 'admin'), tankRow(demo.tanks.nano), 'A nitrite reading was entered on the wrong tank.', now)
    expect(row.status).toBe('reopened')
    expect(tankRow(demo.tanks.nano).status).toBe('cycling')
    expect(lockedUntil(db, demo.tanks.nano)).toBeNull()
    expect(db.select().from(signOffs).where(and(eq(signOffs.tankId, demo.tanks.nano), eq(signOffs.status, 'approved'))).all()).toEqual([])
  })
})
