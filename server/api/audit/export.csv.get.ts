import Papa from 'papaparse'
import { formatMoment } from '#shared/readings/reader-words'
import { AuditQuerySchema } from '#shared/schemas/audit'
import { readAuditTrail } from '#server/domain/audit/trail'

/**
 * GET /api/audit/export.csv — every audit row the filters match (same filters and scope as
 * GET /api/audit), as CSV with the changes in words: when on the company's clock first, and
 * the exact moment in ISO 8601 (UTC) last, for sorting and for other tools.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'supervisor'])
  const query = await getValidatedQuery(event, valid(AuditQuerySchema))
  const trail = readAuditTrail(useDB(), actor, query, null)
  const data = trail.items.map(row => [
    formatMoment(Date.parse(row.at), trail.timeZone),
    row.actorName ?? (row.actorId ? 'a removed account' : 'Tidewright'),
    row.actionLabel,
    row.action,
    row.tankName ?? '',
    row.changes.map(c => `${c.label}: ${c.before} -> ${c.after}`).join('; '),
    row.at,
  ])
  // escapeFormulae: a value starting with = + - @ must not run as a formula in a spreadsheet.
  const csv = Papa.unparse({ fields: [`When (${trail.timeZone})`, 'Who', 'What', 'Action code', 'Tank', 'Changes (before -> after)', 'At (ISO 8601, UTC)'], data }, { newline: '\n', escapeFormulae: true })
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="audit-trail-${new Date().toISOString().slice(0, 10)}.csv"`)
  return csv
})
