import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase } from '../../../server/db/connection'
import { readings } from '../../../server/db/schema'
import { seedDemo } from '../../../server/db/seed/demo'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-demo-seed-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('the demo company', () => {
  // Early morning is before the usual test hours of every demo client (08:00 and 19:00 UTC),
  // so a history laid out by calendar day would put today's tests in the future.
  it.each(['05:10', '08:05', '19:20'])('seeded at %s UTC shows no test from the future', async (clock) => {
    const db = openDatabase(join(dir, `demo-${clock.replace(':', '')}.sqlite`))
    migrateDatabase(db)
    const now = new Date(`2026-12-02T${clock}:00.000Z`)
    await seedDemo(db, now)
    const taken = db.select({ takenAt: readings.takenAt }).from(readings).all().map(r => r.takenAt)
    expect(taken.length).toBeGreaterThan(40)
    expect(taken.filter(t => t > now.toISOString())).toEqual([])
    db.$client.close()
  })
})
