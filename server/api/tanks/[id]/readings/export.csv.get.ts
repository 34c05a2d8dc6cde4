import Papa from 'papaparse'
import { IdParams } from '#shared/schemas/common'
import { csvNumber, EXPORT_COLUMNS } from '#shared/readings/csv'
import { tankReadings } from '#server/domain/readings/current'

/**
 * GET /api/tanks/:id/readings/export.csv — the tank's current readings (as corrected) as CSV in canonical
 * units (mg/L as N, degrees C, practical salinity); the header names the units. Re-importing
 * the file with its own mapping adds nothing twice.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const rows = tankReadings(useDB(), tank.id)
  const data = rows.map(r => EXPORT_COLUMNS.map(([, key]) => { const value = r[key]; return typeof value === 'number' ? csvNumber(value) : value ?? '' }))
  const csv = Papa.unparse({ fields: EXPORT_COLUMNS.map(([header]) => header), data }, { newline: '\n', escapeFormulae: true })
  const safeName = tank.name.replace(/[^A-Za-z0-9-]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'tank'
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${safeName}-readings.csv"`)
  return `${csv}\n`
})
