/**
 * The pool's sign-off evaluation, called as the worker thread calls it (its own connection
 * from the file's path): the same input, verdict and data revision the request loop's connection
 * gives for the same moment, and a revision that counts a change made on the other connection.
 */
import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { readings } from '../../../../server/db/schema'
import { tankDataRevisionInDb } from '../../../../server/domain/readings/data-revision'
import { evaluateForSignOff } from '../../../../server/domain/sign-off/evaluation'
import { signOffEvaluation } from '../../../../server/workers/sign-off-evaluation'
import { seededDatabase } from '../../../support/seeded-database'

const { db, dbPath, demo } = await seededDatabase('sign-off-evaluation-worker')

describe('the sign-off evaluation task', () => {
  it('gives what the loop gives, as of the same moment; null for no such tank', () => {
    const now = new Date()
    const onLoop = evaluateForSignOff(db, demo.tanks.nano, now)!
    const inPool = signOffEvaluation({ dbPath, tankId: demo.tanks.nano, nowMs: now.getTime(), withInput: true })
    expect(inPool).toEqual(onLoop)
    expect(onLoop.input.now).toBe(now.toISOString())
    expect(onLoop.now).toBe(now.toISOString())
    expect(signOffEvaluation({ dbPath, tankId: 'no-such-tank', nowMs: now.getTime(), withInput: true })).toBeNull()
  })

  it('hands back no input when none is wanted (a request records none)', () => {
    const now = new Date()
    const onLoop = evaluateForSignOff(db, demo.tanks.nano, now)!
    const inPool = signOffEvaluation({ dbPath, tankId: demo.tanks.nano, nowMs: now.getTime(), withInput: false })
    expect(inPool).toEqual({ now: onLoop.now, verdict: onLoop.verdict, revision: onLoop.revision })
    expect(inPool).not.toHaveProperty('input')
  })

  it('reads the revision the request loop\'s connection wrote', () => {
    const before = signOffEvaluation({ dbPath, tankId: demo.tanks.nano, nowMs: Date.now(), withInput: false })!
    const test = db.select({ id: readings.id }).from(readings).where(eq(readings.tankId, demo.tanks.nano)).get()!
    db.update(readings).set({ notes: 'read again' }).where(eq(readings.id, test.id)).run()
    const after = signOffEvaluation({ dbPath, tankId: demo.tanks.nano, nowMs: Date.now(), withInput: false })!.revision
    expect(after).toBeGreaterThan(before.revision)
    expect(after).toBe(tankDataRevisionInDb(db, demo.tanks.nano))
  })
})
