import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../shared/cycle/engine'
import { RULE_SET_VERSION } from '../../../shared/cycle/registry'
import type { CycleInput, Verdict } from '../../../shared/cycle/types'
import { migrateDatabase, openDatabase } from '../../../server/db/connection'
import { seedDemo } from '../../../server/db/seed/demo'
import { cycleInputFor } from '../../../server/db/verdicts'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-snapshot-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('the sign-off snapshot of a demo tank', () => {
  it('is the engine input from the database; stored as JSON it reproduces the verdict exactly', async () => {
    const db = openDatabase(join(dir, 'demo.sqlite'))
    migrateDatabase(db)
    const now = new Date()
    const ids = await seedDemo(db, now)
    const input = cycleInputFor(db, ids.tanks.nano, now)!
    const verdict = evaluateCycle(input)
    expect(verdict.phase).toBe('complete')
    expect(verdict.ruleSetVersion).toBe(RULE_SET_VERSION)
    const stored = JSON.parse(JSON.stringify({ input, verdict })) as { input: CycleInput, verdict: Verdict }
    expect(stored.input.now).toBe(now.toISOString())
    expect(evaluateCycle(stored.input)).toEqual(stored.verdict)
    expect(stored.input.readings.map(r => r.id)).toEqual(input.readings.map(r => r.id))
    db.$client.close()
  })
})
