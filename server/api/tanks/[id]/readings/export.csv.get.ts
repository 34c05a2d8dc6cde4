import { IdParams } from '#shared/schemas/common'
import { readingsCsv } from '#server/domain/readings/export'
import { hasLongHistory } from '#server/domain/tanks/long-history'

/**
 * GET /api/tanks/:id/readings/export.csv — the tank's current readings (as corrected) as CSV in canonical
 * units (mg/L as N, degrees C, practical salinity); the header names the units. Re-importing
 * the file with its own mapping adds nothing twice. A tank with a long history is written in
 * the heavy-work pool, off the request loop.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const db = useDB()
  const csv = hasLongHistory(db, tank.id) ? await exportReadingsOffLoop(tank.id) : readingsCsv(db, tank.id)
  const safeName = tank.name.replace(/[^A-Za-z0-9-]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'tank'
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${safeName}-readings.csv"`)
  return csv
})
