/**
 * The pool's sign-off evaluation, called as the worker thread calls it (its own connection
 * from the file's path): the same input, verdict, data revision and settings the request loop's
 * connection gives for the same moment, a revision that counts a change made on the other
 * connection, and the settings handed back even without the input, so a request on them is still
 * checked against the company's thresholds.
 */
import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { resolveThresholds } from '../../../../shared/cycle/thresholds'
import { readings, tanks } from '../../../../server/db/schema'
import { tankDataRevisionInDb } from '../../../../server/domain/readings/data-revision'
import { readCompanySettings, saveCompanySettings } from '../../../../server/domain/settings/update'
import { decideSignOff, requestSignOff } from '../../../../server/domain/sign-off/commands'
import { EvaluationOutdated, evaluateForSignOff, type SignOffVerdict } from '../../../../server/domain/sign-off/evaluation'
import { signOffEvaluation } from '../../../../server/workers/sign-off-evaluation'
import { seededDatabase } from '../../../support/seeded-database'
import { refusalOf } from '../../../support/sign-off-refusal'

const { db, dbPath, demo } = await seededDatabase('sign-off-evaluation-worker')

describe('the sign-off evaluation task', () => {
  it('gives what the loop gives, as of the same moment, without the input (a request records none); null for no such tank', () => {
    const now = new Date()
    const onLoop = evaluateForSignOff(db, demo.tanks.nano, now)!
    const inPool = signOffEvaluation({ dbPath, tankId: demo.tanks.nano, nowMs: now.getTime() })
    expect(inPool).toEqual({ now: onLoop.now, verdict: onLoop.verdict, revision: onLoop.revision, settings: { tank: onLoop.input.tank, thresholds: onLoop.input.thresholds } })
    expect(inPool).not.toHaveProperty('input')
    expect(onLoop.now).toBe(now.toISOString())
    expect(signOffEvaluation({ dbPath, tankId: 'no-such-tank', nowMs: now.getTime() })).toBeNull()
  })

  it('reads the revision the request loop\'s connection wrote', () => {
    const before = signOffEvaluation({ dbPath, tankId: demo.tanks.nano, nowMs: Date.now() })!
    const test = db.select({ id: readings.id }).from(readings).where(eq(readings.tankId, demo.tanks.nano)).get()!
    db.update(readings).set({ notes: 'read again' }).where(eq(readings.id, test.id)).run()
    const after = signOffEvaluation({ dbPath, tankId: demo.tanks.nano, nowMs: Date.now() })!.revision
    expect(after).toBeGreaterThan(before.revision)
    expect(after).toBe(tankDataRevisionInDb(db, demo.tanks.nano))
  })

  it('hands back what the verdict was made under even without the input: a request on it is refused once the company\'s thresholds changed', () => {
    const aquarist = { id: demo.users.aquarist, organisationId: demo.organisationId, role: 'aquarist' as const }
    const supervisor = { id: demo.users.supervisor, organisationId: demo.organisationId, role: 'supervisor' as const }
    const tankRow = () => db.select().from(tanks).where(eq(tanks.id, demo.tanks.nano)).get()!
    // The demo nano's waiting request is returned first, so it may be asked for again.
    decideSignOff(db, supervisor, tankRow(), 'return', 'Ask again once the photos are in.', evaluateForSignOff(db, demo.tanks.nano, new Date())!)
    const inPool = signOffEvaluation({ dbPath, tankId: demo.tanks.nano, nowMs: Date.now() }) as SignOffVerdict
    expect(inPool.verdict.phase).toBe('complete')
    const current = readCompanySettings(db, demo.organisationId)!
    const thresholds = { ...current.settings.thresholds, stableMinTests: resolveThresholds(current.settings.thresholds).stableMinTests + 1 }
    expect(saveCompanySettings(db, { id: demo.users.admin, organisationId: demo.organisationId }, { name: current.name, settings: { ...current.settings, thresholds }, version: current.version }).ok).toBe(true)
    expect(refusalOf(() => requestSignOff(db, aquarist, tankRow(), 'Zero for a week', true, inPool))).toBeInstanceOf(EvaluationOutdated)
  })
})
