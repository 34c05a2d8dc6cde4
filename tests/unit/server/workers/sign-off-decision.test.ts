/**
 * A long history's sign-off decision is made wholly in the pool (server/workers/sign-off-decision.ts):
 * evaluated, checked and stored with its input on the thread's own connection, handing back the
 * decided row only. Called as the worker thread calls it (its own connection from the file's path),
 * on a real migrated SQLite file with the demo company, whose nano waits for a decision. Its
 * refusals come back as what they say and are thrown again as their own classes, so the request
 * loop answers them as it answers its own.
 */
import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../shared/cycle/engine'
import { OVERRIDE_REASON_MESSAGE } from '../../../../shared/schemas/sign-off'
import { readings, signOffs } from '../../../../server/db/schema'
import { EvaluationOutdated } from '../../../../server/domain/sign-off/evaluation'
import { SignOffRefused } from '../../../../server/domain/sign-off/refusal'
import { carriedRefusal, refusalAgain } from '../../../../server/domain/sign-off/refusal-transfer'
import { signedInput, signedInputHolds } from '../../../../server/domain/sign-off/signed-record'
import { TankStatusRefused } from '../../../../server/domain/tanks/status'
import { signOffDecision, type SignOffDecisionOutcome } from '../../../../server/workers/sign-off-decision'
import { seededDatabase } from '../../../support/seeded-database'

const { db, dbPath, demo } = await seededDatabase('sign-off-decision-worker')
const nano = demo.tanks.nano
const supervisor = { id: demo.users.supervisor, organisationId: demo.organisationId, role: 'supervisor' as const }
const aquarist = { id: demo.users.aquarist, organisationId: demo.organisationId, role: 'aquarist' as const }

/** The refusal an outcome carries, thrown again as the request loop throws it. */
function refusalFrom(outcome: SignOffDecisionOutcome): Error {
  if (outcome.kind !== 'refused') throw new Error(`not refused: ${outcome.kind}`)
  // Across a thread only what structured cloning keeps arrives: no class, no methods.
  return refusalAgain(structuredClone(outcome.refusal))
}

describe('a refusal carried across a thread', () => {
  it('is thrown again as its own class, with its status, message, field and data', () => {
    const refusals = [
      new EvaluationOutdated(),
      new SignOffRefused(400, OVERRIDE_REASON_MESSAGE, { field: 'note', data: { overrideGrounds: ['Not complete.'] } }),
      new SignOffRefused(409, 'No sign-off request is waiting for this tank'),
      new TankStatusRefused('status', 'A tank that is planned cannot be signed off'),
    ]
    for (const refusal of refusals) {
      const again = refusalAgain(structuredClone(carriedRefusal(refusal)!))
      expect(again.constructor).toBe(refusal.constructor)
      expect(again).toEqual(refusal)
      expect(again.message).toBe(refusal.message)
    }
    expect(carriedRefusal(new Error('disk full'))).toBeUndefined()
  })
})

describe('the sign-off decision task', () => {
  it('refuses as the loop refuses: who may decide, a missing reason, no such tank', async () => {
    const forbidden = refusalFrom(await signOffDecision({ dbPath, tankId: nano, actor: aquarist, decision: 'approve', note: '' }))
    expect(forbidden).toBeInstanceOf(SignOffRefused)
    expect(forbidden).toMatchObject({ status: 403, message: 'Only this tank\'s supervisor or an admin may decide' })

    // Ammonia back at 2 mg/L: approving now goes against the engine and needs a written reason.
    const worrying = db.insert(readings).values({ tankId: nano, takenAt: new Date(Date.now() - 10 * 60_000).toISOString(), ammoniaN: 2, nitriteN: 0, nitrateN: 10, pH: 8.1, temperatureC: 25.5, salinity: 35 }).returning().get()
    const noReason = refusalFrom(await signOffDecision({ dbPath, tankId: nano, actor: supervisor, decision: 'approve', note: '' }))
    expect(noReason).toMatchObject({ status: 400, message: OVERRIDE_REASON_MESSAGE, details: { field: 'note', data: { overrideGrounds: expect.arrayContaining([expect.stringMatching(/not complete/)]) } } })
    db.delete(readings).where(eq(readings.id, worrying.id)).run()

    expect(await signOffDecision({ dbPath, tankId: 'no-such-tank', actor: supervisor, decision: 'approve', note: '' })).toEqual({ kind: 'missing' })
    expect(db.select().from(signOffs).where(eq(signOffs.tankId, nano)).all().map(r => r.status)).toEqual(['requested'])
  })

  it('stores the decision and its input, and hands back the row without the input', async () => {
    const outcome = await signOffDecision({ dbPath, tankId: nano, actor: supervisor, decision: 'return', note: 'The leak test photo is missing.' })
    if (outcome.kind !== 'decided') throw new Error(JSON.stringify(outcome))
    const { signOff } = outcome.result
    expect(signOff).toMatchObject({ status: 'returned', decidedBy: supervisor.id, decisionNote: 'The leak test photo is missing.' })
    expect(signOff.snapshot).not.toHaveProperty('input')
    const stored = db.select().from(signOffs).where(eq(signOffs.id, signOff.id)).get()!
    expect(JSON.parse(JSON.stringify(signOff))).toEqual(JSON.parse(JSON.stringify(stored)))
    const input = signedInput(db, signOff.id)!
    expect(input.now).toBe(stored.decidedAt)
    expect(evaluateCycle(input)).toEqual(stored.snapshot!.verdict)
    // The lock's question, asked in SQL over the stored input.
    const held = input.readings[0]!.id
    expect(signedInputHolds(db, signOff.id, held)).toBe(true)
    expect(signedInputHolds(db, signOff.id, 'not-a-test')).toBe(false)
    expect(signedInputHolds(db, 'no-such-sign-off', held)).toBe(false)
    const event = input.events?.[0]
    if (event) expect(signedInputHolds(db, signOff.id, event.id)).toBe(true)
    // Recorded with the decision, in its transaction: exactly the tests and events the input holds.
    const recorded = db.$client.prepare('select entry_id from sign_off_input_entries where sign_off_id = ? order by 1').pluck().all(signOff.id)
    expect(recorded).toEqual([...input.readings.map(r => r.id), ...(input.events ?? []).map(e => e.id)].sort())
  })
})
