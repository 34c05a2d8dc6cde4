/**
 * Test tanks for sign-off: copies of a demo tank (profile, readings, events) written into
 * the real test database, so a test can sign one off without changing the demo tanks
 * other test files rely on. The verdict is evaluated exactly as the seed does it.
 */
import { eq } from 'drizzle-orm'
import type { TidewrightDB } from '../../server/db/connection'
import { events, readings, tanks } from '../../server/db/schema'
import { computeAndStoreVerdict } from '../../server/db/verdicts'

/** Copies tank `sourceId` under a new name; returns the new tank's id. */
export function copyTank(db: TidewrightDB, sourceId: string, name: string, overrides: Partial<typeof tanks.$inferInsert> = {}): string {
  const source = db.select().from(tanks).where(eq(tanks.id, sourceId)).get()
  if (!source) throw new Error(`No tank ${sourceId}`)
  const { id: _id, createdAt: _c, updatedAt: _u, ...profile } = source
  const tankId = db.insert(tanks).values({ ...profile, name, ...overrides }).returning().get().id
  const readingRows = db.select().from(readings).where(eq(readings.tankId, sourceId)).all()
  if (readingRows.length) db.insert(readings).values(readingRows.map(({ id: _i, createdAt: _a, updatedAt: _b, ...r }) => ({ ...r, tankId }))).run()
  const eventRows = db.select().from(events).where(eq(events.tankId, sourceId)).all()
  if (eventRows.length) db.insert(events).values(eventRows.map(({ id: _i, createdAt: _a, updatedAt: _b, ...e }) => ({ ...e, tankId }))).run()
  computeAndStoreVerdict(db, tankId, new Date())
  return tankId
}
