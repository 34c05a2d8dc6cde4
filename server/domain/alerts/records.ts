/**
 * What the alert commands share: the row type, the open key, links to a tank, and the
 * reads (the measured reading, a user) their notices are written from. Framework-free.
 */
import { and, eq } from 'drizzle-orm'
import type { Finding } from '../../../shared/cycle/types'
import type { Db } from '../../db/connection'
import type { alerts } from '../../db/schema'
import { readings, users } from '../../db/schema'
import type { MeasuredReading } from './mail'

export type AlertRow = typeof alerts.$inferSelect

export const openKeyFor = (tankId: string, kind: string) => `${tankId}:${kind}`
export const tankLink = (tankId: string) => `/tanks/${tankId}`
export const tankUrl = (baseUrl: string, tankId: string) => `${baseUrl.replace(/\/+$/, '')}${tankLink(tankId)}`

export function measuredReading(db: Db, readingId: string | undefined | null): MeasuredReading | null {
  if (!readingId) return null
  return db.select({
    takenAt: readings.takenAt, ammoniaN: readings.ammoniaN, nitriteN: readings.nitriteN, nitrateN: readings.nitrateN,
    pH: readings.pH, temperatureC: readings.temperatureC, salinity: readings.salinity,
  }).from(readings).where(eq(readings.id, readingId)).get() ?? null
}

/** The sign-in accounts of the tank's own client: the people at the tank who must act. */
export function clientUsers(db: Db, clientId: string) {
  return db.select().from(users).where(and(eq(users.clientId, clientId), eq(users.role, 'client'), eq(users.active, true))).all()
}

export function userRow(db: Db, id: string | null) {
  return id ? db.select().from(users).where(eq(users.id, id)).get() : undefined
}

/** The reading a finding rests on most recently: the newest of its readings, else the one just entered. */
export function findingReading(finding: Finding, readingId: string | undefined): string | undefined {
  return finding.readingIds.at(-1) ?? readingId
}
