/**
 * The import's options in the query string (a file sent as the request's body) read back to
 * the options the form sent, with the JSON way's defaults and field names, and no key of the
 * query reaches an object's prototype.
 */
import * as v from 'valibot'
import { describe, expect, it } from 'vitest'
import { importOptionsQuery, ReadingImportQuerySchema, ReadingImportSchema } from '../../../../shared/schemas/reading'

const fieldsOf = (query: Record<string, unknown>) => {
  const parsed = v.safeParse(ReadingImportQuerySchema, query)
  return parsed.success ? [] : parsed.issues.map(issue => v.getDotPath(issue))
}

describe('the import\'s options in the query string', () => {
  it('reads back what the form sends, and defaults as the JSON way does', () => {
    const options = { dryRun: false, basis: { ammonia: 'NH3', nitrite: 'N', nitrate: 'NO3' }, temperatureUnit: 'F', salinityMode: 'sg', sgBasis: '25/25C', mapping: { takenAt: 'Datum', notes: 'Notiz' } } as const
    expect(v.parse(ReadingImportQuerySchema, importOptionsQuery(options))).toEqual(options)
    const { csv: _csv, ...jsonDefaults } = v.parse(ReadingImportSchema, { csv: 'x' })
    expect(v.parse(ReadingImportQuerySchema, {})).toEqual(jsonDefaults)
  })

  it('names the field of a bad option as the JSON way names it', () => {
    expect(fieldsOf({ temperatureUnit: 'K' })).toEqual(['temperatureUnit'])
    expect(fieldsOf({ 'basis.ammonia': 'NO9', 'basis.nitrite': 'N', 'basis.nitrate': 'N' })).toEqual(['basis.ammonia'])
    expect(fieldsOf({ dryRun: 'yes' })).toEqual(['dryRun'])
    expect(fieldsOf({ dryRun: ['true', 'false'] })).toEqual(['dryRun'])
  })

  it('keeps every key of the query an own property, and leaves unknown ones out', () => {
    const read = v.parse(ReadingImportQuerySchema, { '__proto__.polluted': 'yes', 'constructor.prototype.polluted': 'yes', 'dryRun': 'false' })
    expect(read).not.toHaveProperty('constructor.prototype')
    expect(read.dryRun).toBe(false)
    expect(({} as Record<string, unknown>).polluted).toBeUndefined()
  })
})
