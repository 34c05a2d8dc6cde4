/**
 * The lock's question on a signed tank with a 100,000-test signed input: is this entry in what was
 * signed? Asked on the request loop for every edit, correction or delete of an entry dated after
 * the decision. Times, in one process on one migrated SQLite file, the keyed lookup
 * (`signedInputHolds` over sign_off_input_entries) beside the question as it was asked before it
 * (json_each over the stored input, kept here only to compare), alternated, for an entry the input
 * holds (its last test) and one it does not (a test saved after the decision: the usual case), and
 * what recording the entries adds to the decision's transaction (made in the pool for such a tank).
 * Run: npx tsx bench/sign-off-lock.ts
 */
import { randomUUID } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { performance } from 'node:perf_hooks'
import type { CycleInput, CycleReading } from '../shared/cycle/types'
import { migrateDatabase, openDatabase } from '../server/db/connection'
import { signOffInputs } from '../server/db/schema'
import { recordSignedInput, signedInputHolds } from '../server/domain/sign-off/signed-record'
import { percentile, sorted } from './support'

const TESTS = 100_000
const ROUNDS = Number(process.env.BENCH_LOCK_ROUNDS ?? 40)
const HALF_HOUR = 1_800_000

const dir = mkdtempSync(join(tmpdir(), 'tidewright-sign-off-lock-'))
const db = openDatabase(join(dir, 'lock.sqlite'))
try {
  migrateDatabase(db)
  const end = Date.parse('2026-11-30T09:00:00.000Z')
  const readings: CycleReading[] = Array.from({ length: TESTS }, (_, i) => {
    const at = new Date(end - (TESTS - i) * HALF_HOUR).toISOString()
    return { id: randomUUID(), takenAt: at, ammoniaN: 0, nitriteN: 0, nitrateN: 0.5, pH: 8.1, temperatureC: 25, salinity: 35, enteredAt: at }
  })
  const input: CycleInput = {
    now: new Date(end).toISOString(),
    tank: { volumeLitres: 120, cycleMethod: 'fishless', startedAt: readings[0]!.takenAt },
    readings,
    events: [{ id: randomUUID(), at: readings[10]!.takenAt, kind: 'ammonia-dose', amount: 2 }],
  }
  // The decision's own rows are beside the point: only what the decision stores is timed.
  db.$client.pragma('foreign_keys = OFF')
  const inputOnly = 'input-only'
  const signed = 'signed'
  const stored = timedOnce(() => db.transaction(tx => tx.insert(signOffInputs).values({ signOffId: inputOnly, input }).run()))
  const recorded = timedOnce(() => db.transaction(tx => recordSignedInput(tx, signed, input)))
  const bytes = db.$client.prepare('select length(input) from sign_off_inputs where sign_off_id = ?').pluck().get(signed) as number

  // The question as it was asked before sign_off_input_entries: json_each over the stored input.
  const overJson = db.$client.prepare(`select (exists (select 1 from json_each(input, '$.readings') where json_extract(value, '$.id') = @entryId)
    or exists (select 1 from json_each(input, '$.events') where json_extract(value, '$.id') = @entryId)) as held from sign_off_inputs where sign_off_id = @signOffId`)
  const cases = { 'held (its last test)': readings.at(-1)!.id, 'not held (saved after the decision)': randomUUID() }
  for (const [label, entryId] of Object.entries(cases)) {
    const before: number[] = []
    const after: number[] = []
    let agree = true
    for (let round = 0; round < ROUNDS; round++) {
      let t = performance.now()
      const old = Boolean((overJson.get({ signOffId: signed, entryId }) as { held: number }).held)
      before.push(performance.now() - t)
      t = performance.now()
      const now = signedInputHolds(db, signed, entryId)
      after.push(performance.now() - t)
      agree &&= old === now
    }
    const [b, a] = [sorted(before), sorted(after)]
    console.log(`lock check, ${TESTS.toLocaleString('en')}-test signed input (${(bytes / 1e6).toFixed(1)} MB), entry ${label}, ${ROUNDS} rounds, answers ${agree ? 'agree' : 'DIFFER'}:`
      + ` json_each p50 ${percentile(b, 0.5).toFixed(3)} ms, p99 ${percentile(b, 0.99).toFixed(3)} ms; keyed p50 ${percentile(a, 0.5).toFixed(4)} ms, p99 ${percentile(a, 0.99).toFixed(4)} ms;`
      + ` ratio ${(percentile(b, 0.5) / percentile(a, 0.5)).toFixed(0)}x`)
  }
  console.log(`decision's transaction: the input alone ${stored.toFixed(0)} ms; the input and its ${TESTS + 1} entry rows ${recorded.toFixed(0)} ms`)
}
finally {
  db.$client.close()
  rmSync(dir, { recursive: true, force: true })
}

function timedOnce(work: () => void): number {
  const t = performance.now()
  work()
  return performance.now() - t
}
