/**
 * A sign-off request or decision is made on an evaluation made before it (in the heavy-work pool
 * for a long history, while the request loop serves others): the command stores it only if the
 * tank's data revision is still the one the evaluation was made at, and the tank's profile and the
 * company's thresholds still the ones its verdict was made under, checked inside its write
 * transaction. On a real migrated SQLite file with the demo company; the demo nano waits for a
 * decision and its cycle is complete.
 */
import { and, eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../../shared/cycle/engine'
import type { SignOffSnapshot } from '../../../../../shared/types/sign-off'
import { auditLog, readings, signOffs, tanks } from '../../../../../server/db/schema'
import { readCompanySettings, saveCompanySettings } from '../../../../../server/domain/settings/update'
import type { OrganisationSettings } from '../../../../../shared/schemas/settings'
import { decideSignOff, requestSignOff } from '../../../../../server/domain/sign-off/commands'
import { EvaluationOutdated, evaluateForSignOff, onCurrentEvaluation, SIGN_OFF_ATTEMPTS, type SignOffEvaluation } from '../../../../../server/domain/sign-off/evaluation'
import { tankDataRevisionInDb } from '../../../../../server/domain/readings/data-revision'
import { SignOffRefused } from '../../../../../server/domain/sign-off/refusal'
import { signedInput } from '../../../../../server/domain/sign-off/signed-record'
import { seededDatabase } from '../../../../support/seeded-database'
import { refusalOf } from '../../../../support/sign-off-refusal'

const { db, demo } = await seededDatabase('sign-off-evaluation')
const nano = demo.tanks.nano
const supervisor = { id: demo.users.supervisor, organisationId: demo.organisationId, role: 'supervisor' as const }
const aquarist = { id: demo.users.aquarist, organisationId: demo.organisationId, role: 'aquarist' as const }
const tankRow = () => db.select().from(tanks).where(eq(tanks.id, nano)).get()!
const signOffRows = () => db.select().from(signOffs).where(eq(signOffs.tankId, nano)).all()
const auditCount = () => db.select().from(auditLog).all().length

/** The evaluation as of a moment, made as the glue makes it. */
function evaluation(now = new Date()): SignOffEvaluation {
  const made = evaluateForSignOff(db, nano, now)
  if (!made) throw new Error('no such tank')
  return made
}

/** A change to one of the tank's tests that the engine does not read: only the tank's data revision moves. */
function touchATest(): void {
  const test = db.select({ id: readings.id }).from(readings).where(eq(readings.tankId, nano)).get()!
  db.update(readings).set({ notes: `looked at ${Date.now()}` }).where(eq(readings.id, test.id)).run()
}

/** The company settings saved as the settings form saves them, with `change` made to them. */
function saveSettings(change: (settings: OrganisationSettings) => OrganisationSettings): void {
  const current = readCompanySettings(db, demo.organisationId)!
  const saved = saveCompanySettings(db, { id: demo.users.admin, organisationId: demo.organisationId }, { name: current.name, settings: change(current.settings), version: current.version })
  expect(saved.ok).toBe(true)
}

/** One of the company's thresholds moved by a little (the engine reads every threshold). */
function nudgeAThreshold(): void {
  saveSettings((settings) => {
    const max = settings.thresholds.temperatureMaxC ?? 29
    return { ...settings, thresholds: { ...settings.thresholds, temperatureMaxC: max === 29 ? 28.5 : 29 } }
  })
}

/** Nothing of the refused command was written: the rows, the tank's status and the audit log are as they were. */
function expectUnchanged(before: { rows: unknown, status: string, audit: number }): void {
  expect(signOffRows()).toEqual(before.rows)
  expect(tankRow().status).toBe(before.status)
  expect(auditCount()).toBe(before.audit)
}
const stateNow = () => ({ rows: signOffRows(), status: tankRow().status, audit: auditCount() })

describe('a sign-off command given an evaluation made before the tank\'s data changed', () => {
  it('reads the revision with the input: the revision is the tank\'s current one', () => {
    const made = evaluation()
    expect(made.revision).toBe(tankDataRevisionInDb(db, nano))
    expect(made.revision).toBeGreaterThan(0)
    expect(made.verdict).toEqual(evaluateCycle(made.input))
  })

  it('refuses a decision on an out-of-date evaluation (409) and stores nothing', () => {
    const before = stateNow()
    const made = evaluation()
    touchATest()
    const refused = refusalOf(() => decideSignOff(db, supervisor, tankRow(), 'approve', 'Cycle proven.', made))
    expect(refused).toBeInstanceOf(EvaluationOutdated)
    expect(refused).toMatchObject({ status: 409, message: 'The tank\'s tests or settings changed while the sign-off was being checked. Try again.' })
    expectUnchanged(before)
    expect(signOffRows().filter(r => r.status === 'approved')).toEqual([])
    expect(tankRow().status).toBe('cycled')
  })

  it('never approves without a worrying test saved while the approval was being checked', () => {
    const made = evaluation()
    expect(made.verdict.phase).toBe('complete')
    // Ammonia back at 2 mg/L: the cycle is no longer complete.
    const worrying = db.insert(readings).values({ tankId: nano, takenAt: new Date(Date.now() - 10 * 60_000).toISOString(), ammoniaN: 2, nitriteN: 0, nitrateN: 10, pH: 8.1, temperatureC: 25.5, salinity: 35 }).returning().get()
    const before = stateNow()
    expect(refusalOf(() => decideSignOff(db, supervisor, tankRow(), 'approve', 'Cycle proven.', made))).toBeInstanceOf(EvaluationOutdated)
    expectUnchanged(before)

    // Made again, the verdict holds the test: approving now goes against the engine and needs a written reason.
    const again = evaluation()
    expect(again.input.readings.map(r => r.id)).toContain(worrying.id)
    expect(again.verdict.phase).not.toBe('complete')
    expect(refusalOf(() => decideSignOff(db, supervisor, tankRow(), 'approve', '', again))).toMatchObject({ status: 400, details: { field: 'note' } })
    expectUnchanged(before)
    // The test is removed: the tank's rows are as the first evaluation saw them, but its revision has moved on.
    db.delete(readings).where(eq(readings.id, worrying.id)).run()
    expect(refusalOf(() => decideSignOff(db, supervisor, tankRow(), 'approve', 'Cycle proven.', made))).toBeInstanceOf(EvaluationOutdated)
    expectUnchanged(before)
  })

  it('stores a decision on the current evaluation exactly as before: its input and verdict, which re-run alike', () => {
    const made = evaluation()
    const { signOff } = decideSignOff(db, supervisor, tankRow(), 'return', 'The leak test photo is missing.', made)
    expect(signOff).toMatchObject({ status: 'returned', decidedBy: supervisor.id, decidedAt: made.input.now, ruleSetVersion: made.verdict.ruleSetVersion })
    const stored = db.select().from(signOffs).where(eq(signOffs.id, signOff.id)).get()!
    const snapshot = stored.snapshot as SignOffSnapshot
    const input = signedInput(db, signOff.id)!
    expect(input).toEqual(JSON.parse(JSON.stringify(made.input)))
    expect(snapshot).not.toHaveProperty('input')
    expect(snapshot.verdict).toEqual(JSON.parse(JSON.stringify(made.verdict)))
    expect(input.now).toBe(stored.decidedAt)
    expect(evaluateCycle(input)).toEqual(snapshot.verdict)
    // The answer carries the snapshot as stored (the command does not read it back).
    expect(JSON.parse(JSON.stringify(signOff))).toEqual(JSON.parse(JSON.stringify(stored)))
    expect(tankRow().status).toBe('cycling')
    expect(db.select({ action: auditLog.action }).from(auditLog).where(eq(auditLog.entityId, signOff.id)).all().map(a => a.action)).toEqual(['sign-off.return'])
  })

  it('refuses a request on an out-of-date evaluation (409) and stores nothing; on the current one it is stored', () => {
    const before = stateNow()
    const made = evaluation()
    expect(made.verdict.phase).toBe('complete')
    touchATest()
    expect(refusalOf(() => requestSignOff(db, aquarist, tankRow(), 'Zero for a week', true, made))).toBeInstanceOf(EvaluationOutdated)
    expectUnchanged(before)
    expect(signOffRows().filter(r => r.status === 'requested')).toEqual([])

    const current = evaluation()
    const row = requestSignOff(db, aquarist, tankRow(), 'Zero for a week', true, current)
    expect(row).toMatchObject({ status: 'requested', requestedAt: current.input.now, requestNote: 'Zero for a week' })
    expect(tankRow().status).toBe('cycled')
    expect(db.select().from(signOffs).where(and(eq(signOffs.tankId, nano), eq(signOffs.status, 'requested'))).all()).toHaveLength(1)
  })

  it('keeps the refusals that come before the evaluation first: a second request while one waits is 409 whatever the revision', () => {
    const made = evaluation()
    touchATest()
    expect(refusalOf(() => requestSignOff(db, aquarist, tankRow(), '', true, made))).toMatchObject({ status: 409, message: expect.stringContaining('already waiting') })
    expect(refusalOf(() => decideSignOff(db, aquarist, tankRow(), 'approve', '', made)).status).toBe(403)
  })
})

describe('a sign-off command whose tank changes while it is evaluated', () => {
  /** The decision's steps as the glue runs them; the tank's tests change after each of the first `changes` evaluations. */
  function returnWhileChanging(changes: number) {
    let evaluations = 0
    const run = onCurrentEvaluation({
      check: () => void decideCheck(),
      evaluate: async () => {
        const made = evaluation()
        if (evaluations++ < changes) touchATest()
        return made
      },
      command: made => decideSignOff(db, supervisor, tankRow(), 'return', 'Photos of the sump are missing.', made),
    })
    return { run, evaluations: () => evaluations }
  }
  /** The decision's own refusals, before any evaluation. */
  const decideCheck = () => {
    if (!signOffRows().some(r => r.status === 'requested')) throw new SignOffRefused(409, 'No sign-off request is waiting for this tank')
  }

  it('is refused (409) after SIGN_OFF_ATTEMPTS evaluations that the tank\'s tests kept overtaking; nothing is stored', async () => {
    const before = stateNow()
    const { run, evaluations } = returnWhileChanging(SIGN_OFF_ATTEMPTS)
    await expect(run).rejects.toBeInstanceOf(EvaluationOutdated)
    expect(evaluations()).toBe(3)
    expectUnchanged(before)
  })

  it('is evaluated again after a change and stored on the evaluation that follows it', async () => {
    const { run, evaluations } = returnWhileChanging(SIGN_OFF_ATTEMPTS - 1)
    const { signOff } = await run
    expect(evaluations()).toBe(3)
    expect(signOff.status).toBe('returned')
    const input = signedInput(db, signOff.id)!
    expect(input).toEqual(JSON.parse(JSON.stringify(evaluation(new Date(input.now)).input)))
  })

  it('answers a refusal that needs no engine before any evaluation', async () => {
    let evaluated = false
    await expect(onCurrentEvaluation({
      check: decideCheck,
      evaluate: async () => {
        evaluated = true
        return evaluation()
      },
      command: () => 'stored',
    })).rejects.toMatchObject({ status: 409, message: 'No sign-off request is waiting for this tank' })
    expect(evaluated).toBe(false)
  })
})

describe('a sign-off command given an evaluation made before what else the engine reads changed', () => {
  const OUTDATED = { status: 409, message: 'The tank\'s tests or settings changed while the sign-off was being checked. Try again.' }

  /** The tank's row changed in one of the fields the engine reads of it. */
  const profileChanges: Array<[string, (tank: ReturnType<typeof tankRow>) => Partial<ReturnType<typeof tankRow>>]> = [
    ['volume', tank => ({ volumeLitres: tank.volumeLitres + 10 })],
    ['sump', tank => ({ sumpLitres: tank.sumpLitres + 5 })],
    ['cycle method', tank => ({ cycleMethod: tank.cycleMethod === 'fishless' ? 'fish-in' : 'fishless' })],
    ['cycle start', tank => ({ cycleStartedAt: new Date(Date.parse(tank.cycleStartedAt ?? tank.createdAt) - 3_600_000).toISOString() })],
  ]
  const changeTank = (change: (tank: ReturnType<typeof tankRow>) => Partial<ReturnType<typeof tankRow>>) =>
    db.update(tanks).set(change(tankRow())).where(eq(tanks.id, nano)).run()

  it('refuses a request on an evaluation made under thresholds since changed (409) and stores nothing; on the current ones it is stored', () => {
    expect(signOffRows().some(r => r.status === 'requested')).toBe(false)
    const made = evaluation()
    expect(made.verdict.phase).toBe('complete')
    nudgeAThreshold()
    // Taken after the save, whose own audit row is not the command's.
    const before = stateNow()
    // Only the company's limits moved: the tank's tests are as the evaluation read them.
    expect(tankDataRevisionInDb(db, nano)).toBe(made.revision)
    const refused = refusalOf(() => requestSignOff(db, aquarist, tankRow(), 'Zero for a week', true, made))
    expect(refused).toBeInstanceOf(EvaluationOutdated)
    expect(refused).toMatchObject(OUTDATED)
    expectUnchanged(before)

    const current = evaluation()
    expect(current.input.thresholds).toEqual(readCompanySettings(db, demo.organisationId)!.settings.thresholds)
    expect(requestSignOff(db, aquarist, tankRow(), 'Zero for a week', true, current)).toMatchObject({ status: 'requested', requestedAt: current.now })
  })

  it('refuses a decision on an evaluation made under thresholds since changed (409) and stores nothing', () => {
    const made = evaluation()
    nudgeAThreshold()
    const before = stateNow()
    expect(tankDataRevisionInDb(db, nano)).toBe(made.revision)
    expect(refusalOf(() => decideSignOff(db, supervisor, tankRow(), 'approve', 'Cycle proven.', made))).toMatchObject(OUTDATED)
    expectUnchanged(before)
  })

  for (const [label, change] of profileChanges) {
    it(`refuses a decision on an evaluation made before the tank's ${label} changed (409) and stores nothing`, () => {
      const made = evaluation()
      changeTank(change)
      const before = stateNow()
      expect(tankDataRevisionInDb(db, nano)).toBe(made.revision)
      expect(refusalOf(() => decideSignOff(db, supervisor, tankRow(), 'approve', 'Cycle proven.', made))).toMatchObject(OUTDATED)
      expectUnchanged(before)
      // Made again, the evaluation reads the tank as it is now.
      expect(evaluation().input.tank).not.toEqual(made.input.tank)
    })
  }

  it('stores a decision on an evaluation made before a change the engine does not read (the tank\'s name, the company\'s time zone)', () => {
    const made = evaluation()
    changeTank(tank => ({ name: `${tank.name} (renamed)` }))
    saveSettings(settings => ({ ...settings, timeZone: settings.timeZone === 'Europe/London' ? 'UTC' : 'Europe/London' }))
    const { signOff } = decideSignOff(db, supervisor, tankRow(), 'return', 'The sump photos are missing.', made)
    expect(signOff.status).toBe('returned')
    expect(signedInput(db, signOff.id)).toEqual(JSON.parse(JSON.stringify(made.input)))
  })
})
