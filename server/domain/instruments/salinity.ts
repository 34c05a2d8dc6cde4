/**
 * The salinity instrument each person last tested each tank with, kept on the server so every
 * device they test from opens the daily form the same way. Framework-free: takes a database handle.
 */
import { and, eq } from 'drizzle-orm'
import * as v from 'valibot'
import type { Db } from '#server/db/connection'
import { salinityInstruments } from '#server/db/schema'
import { SalinityInstrumentSchema, type SalinityInstrument } from '#shared/schemas/salinity-instrument'

/** The person's remembered instrument for the tank, or null (none yet, or a stored scale this version no longer knows). */
export function salinityInstrumentOf(db: Db, userId: string, tankId: string): SalinityInstrument | null {
  const row = db.select({ mode: salinityInstruments.mode, sgBasis: salinityInstruments.sgBasis }).from(salinityInstruments)
    .where(and(eq(salinityInstruments.userId, userId), eq(salinityInstruments.tankId, tankId))).get()
  const parsed = v.safeParse(SalinityInstrumentSchema, row)
  return parsed.success ? parsed.output : null
}

/** Remembers the instrument (insert or replace); the caller writes the audit row in the same transaction. */
export function rememberSalinityInstrument(db: Db, userId: string, tankId: string, instrument: SalinityInstrument): void {
  db.insert(salinityInstruments).values({ userId, tankId, ...instrument })
    .onConflictDoUpdate({ target: [salinityInstruments.userId, salinityInstruments.tankId], set: { ...instrument, updatedAt: new Date().toISOString() } }).run()
}
