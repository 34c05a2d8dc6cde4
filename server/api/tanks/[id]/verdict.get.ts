import { inArray, sql } from 'drizzle-orm'
import { IdParams } from '#shared/schemas/common'
import type { VerdictView } from '#shared/types/readings'
import { readings } from '#server/db/schema'
import { preparedPerDb } from '#server/db/prepared'

/** The readings a verdict cites, prepared once: the ids go in as one JSON array, however many there are. */
const citedReadings = preparedPerDb(db => db.select({ id: readings.id, takenAt: readings.takenAt, ammoniaN: readings.ammoniaN, nitriteN: readings.nitriteN, nitrateN: readings.nitrateN,
  pH: readings.pH, temperatureC: readings.temperatureC, salinity: readings.salinity })
  .from(readings).where(inArray(readings.id, sql`(select value from json_each(${sql.placeholder('ids')}))`)).prepare())

/**
 * GET /api/tanks/:id/verdict — the rule engine's verdict as of now (the stored one, made
 * again first when missing or older than the verdict interval), with the description and source
 * of each rule its findings and livestock blockers name and the readings the findings rest on.
 * Returns VerdictView.
 */
export default defineEventHandler(async (event): Promise<VerdictView> => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const db = useDB()
  // The verdict is as of now: a stored one older than the verdict interval is made again first.
  const stored = await currentVerdictRow(tank.id, requestNow(event))
  if (!stored) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  const verdict = stored.verdict
  const readingIds = [...new Set(verdict.findings.flatMap(f => f.readingIds))]
  const rows = readingIds.length ? citedReadings(db).all({ ids: JSON.stringify(readingIds.slice(0, 500)) }) : []
  return { verdict, evaluatedAt: stored.evaluatedAt, rules: stored.rules, readings: Object.fromEntries(rows.map(r => [r.id, r])) }
})
