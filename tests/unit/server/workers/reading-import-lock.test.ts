/**
 * The CSV import runs in a worker thread: the signed-off boundary is read when the request
 * arrives, and the rows are written later, on the worker's own connection. A sign-off
 * approved in between must not let the file write tests into the period the supervisor has
 * just signed. Real migrated SQLite file with the demo company; the worker's function is
 * called directly, with the boundary as the request saw it (nothing signed).
 */
import { randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { readings, signOffs } from '../../../../server/db/schema'
import { lockedUntil } from '../../../../server/domain/sign-off/lock'
import { readingImport } from '../../../../server/workers/reading-import'
import { seededDatabase } from '../../../support/seeded-database'

const { db, dbPath, demo, now } = await seededDatabase('import-lock')

const hoursAgo = (h: number) => new Date(now.getTime() - h * 3_600_000).toISOString()
const csv = ['taken_at,ammonia,nitrite,nitrate', `${hoursAgo(30)},0,0,5`, `${hoursAgo(6)},0,0,5`].join('\n')
const countOn = (tankId: string) => db.select().from(readings).where(eq(readings.tankId, tankId)).all().length

function task(tankId: string, lockedMs: number | null) {
  return {
    dbPath,
    tankId,
    actor: { id: demo.users.aquarist, organisationId: demo.organisationId },
    input: { mapping: {}, temperatureUnit: 'C' as const, salinityMode: 'practical' as const, dryRun: false },
    file: { text: csv },
    kit: { ammonia: 'N', nitrite: 'N', nitrate: 'N' } as never,
    lockedMs,
    nowMs: now.getTime(),
  }
}

describe('CSV import in the worker and the signed record', () => {
  it('writes nothing when a sign-off was approved after the request read the boundary', () => {
    const tankId = demo.tanks.nano
    const before = countOn(tankId)
    db.insert(signOffs).values({
      id: randomUUID(), organisationId: demo.organisationId, tankId, requestedBy: demo.users.aquarist, requestedAt: hoursAgo(3),
      status: 'approved', decidedBy: demo.users.supervisor, decidedAt: hoursAgo(1),
    }).run()
    const result = readingImport(task(tankId, null))
    expect(result.kind).toBe('lock-moved')
    expect(countOn(tankId)).toBe(before)
  })

  it('writes the file when the boundary is still the one the request saw', () => {
    const tankId = demo.tanks.nano
    const locked = lockedUntil(db, tankId)!
    const before = countOn(tankId)
    const later = { ...task(tankId, Date.parse(locked)), file: { text: ['taken_at,ammonia,nitrite,nitrate', `${now.toISOString()},0,0,5`].join('\n') } }
    const result = readingImport(later)
    expect(result.kind).toBe('done')
    expect(countOn(tankId)).toBe(before + 1)
  })
})
