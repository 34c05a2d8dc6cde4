/**
 * The evidence's page of tests and events, made as JSON text (in the heavy-work pool), and the
 * answer's text put together around it: the same text JSON.stringify gives for the whole
 * Evidence, fields in the answer's order, on a real migrated SQLite file with the demo company.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../../../../server/db/connection'
import { seedDemo, type DemoIds } from '../../../../../server/db/seed/demo'
import { evidencePageText, evidenceText, type EvidenceHead, type EvidenceTail } from '../../../../../server/domain/sign-off/evidence-page'
import { tankEvents, tankReadings } from '../../../../../server/domain/readings/current'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-evidence-page-'))
let db: TidewrightDB
let demo: DemoIds

beforeAll(async () => {
  db = openDatabase(join(dir, 'evidence.sqlite'))
  migrateDatabase(db)
  demo = await seedDemo(db, new Date())
})
afterAll(() => {
  db?.$client.close()
  rmSync(dir, { recursive: true, force: true })
})

// Stand-ins for the parts read on the request loop: only their place in the text matters here.
const head = { tank: { id: 't', name: 'Lounge "reef"' }, verdict: { phase: 'nitrite', findings: [] }, evaluatedAt: '2026-12-04T10:00:00.000Z', overrideGrounds: ['not complete'], page: 1, pageSize: 1000, readingsTotal: 0, eventsTotal: 0 } as unknown as EvidenceHead
const tail = { stages: [], uploads: [], alerts: [], signOffs: [], lockedUntil: null, canDecide: false, canReopen: true } as unknown as EvidenceTail

describe('the evidence page as text', () => {
  it('holds every stored test and event of the tank, oldest first, with the totals', () => {
    const tankId = demo.tanks.lounge
    const page = evidencePageText(db, tankId, 1)
    const stored = tankReadings(db, tankId, { which: 'all' })
    expect(stored.length).toBeGreaterThan(0)
    expect((JSON.parse(page.readings) as { id: string }[]).map(r => r.id)).toEqual(stored.map(r => r.id))
    expect((JSON.parse(page.events) as { id: string }[]).map(e => e.id)).toEqual(tankEvents(db, tankId, { which: 'all' }).map(e => e.id))
    expect(page.readingsTotal).toBe(stored.length)
  })

  it('puts the answer together as JSON.stringify would write the whole Evidence, in its field order', () => {
    for (const tankId of Object.values(demo.tanks)) {
      const page = evidencePageText(db, tankId, 1)
      const whole = { ...head, readingsTotal: page.readingsTotal, eventsTotal: page.eventsTotal }
      const text = evidenceText(whole, page, tail)
      expect(text).toBe(JSON.stringify({ ...whole, readings: JSON.parse(page.readings), events: JSON.parse(page.events), ...tail }))
    }
  })
})
