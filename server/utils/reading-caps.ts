/**
 * The tests-per-day cap on the form's paths (a new test, an edit that moves one). Call it
 * inside the write's transaction, after the write: the count then includes this test and
 * every test committed before it, so two requests at once cannot both take the last room
 * (SQLite serialises writers). Throwing rolls the write back.
 */
import type { H3Event } from 'h3'
import { dayFullMessage, dayOf, TESTS_PER_TANK_PER_DAY } from '#shared/readings/limits'
import type { Db } from '#server/db/connection'
import { testsOnDayOf } from '#server/domain/readings/day-cap'

/** 429 when the day of `takenAt` now holds more than the cap; Retry-After when that day is today (UTC). */
export function assertDayNotOverfull(event: H3Event, db: Db, tankId: string, takenAt: string, now = new Date()): void {
  if (testsOnDayOf(db, tankId, takenAt) <= TESTS_PER_TANK_PER_DAY) return
  const day = dayOf(takenAt)
  if (day === dayOf(now.toISOString())) {
    const midnight = Date.parse(`${day}T00:00:00Z`) + 86_400_000
    setResponseHeader(event, 'Retry-After', Math.max(1, Math.ceil((midnight - now.getTime()) / 1000)))
  }
  const message = dayFullMessage(day)
  throw createError({ statusCode: 429, statusMessage: message, message, data: { day, limit: TESTS_PER_TANK_PER_DAY } })
}
