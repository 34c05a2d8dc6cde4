/**
 * The CSV import's pure half: the row cap refuses a file one row too long (and stops
 * parsing there), and the day cap keeps a day's first rows up to the room left.
 */
import { describe, expect, it } from 'vitest'
import { capPerDay, planDays, planImport, type ImportPlan } from '../../../../shared/readings/import-plan'
import { MAX_IMPORT_ROWS, TESTS_PER_TANK_PER_DAY } from '../../../../shared/readings/limits'
import { csvNumber, csvNumberText } from '../../../../shared/readings/csv'

const context = { kit: { ammonia: 'N', nitrite: 'N', nitrate: 'N' } as const, lockedMs: Number.NEGATIVE_INFINITY, alreadyImported: () => false, now: new Date('2026-06-01T00:00:00Z') }
const input = (csv: string) => ({ csv, mapping: {}, temperatureUnit: 'C' as const, salinityMode: 'practical' as const, dryRun: true })
const hourly = (count: number, start = Date.parse('2016-01-01T00:00:00Z')) =>
  `takenAt,ammonia\n${Array.from({ length: count }, (_, i) => `${new Date(start + i * 3_600_000).toISOString()},0.25`).join('\n')}`

const planOf = (csv: string): ImportPlan => {
  const outcome = planImport(input(csv), context)
  if (outcome.kind !== 'plan') throw new Error(outcome.kind)
  return outcome.plan
}

describe('rows per import', () => {
  it('takes a file of exactly the cap and refuses one row more', () => {
    expect(planImport(input(hourly(MAX_IMPORT_ROWS)), context).kind).toBe('plan')
    expect(planImport(input(hourly(MAX_IMPORT_ROWS + 1)), context).kind).toBe('too-many-rows')
  })
})

describe('tests per day', () => {
  it('keeps the first rows of a day up to the room it has left and reports the rest', () => {
    const plan = planOf(hourly(24, Date.parse('2026-03-10T00:00:00Z')))
    expect(planDays(plan)).toEqual({ first: '2026-03-10', last: '2026-03-10' })
    const capped = capPerDay(plan, new Map([['2026-03-10', TESTS_PER_TANK_PER_DAY - 3]]))
    expect(capped.rows.line).toEqual([2, 3, 4])
    expect(capped.errorCount).toBe(21)
    expect(capped.errors[0]).toMatchObject({ row: 5, field: 'takenAt' })
    expect(capped.errors[0]!.message).toContain('2026-03-10')
  })

  it('counts each day on its own', () => {
    const plan = planOf(hourly(48, Date.parse('2026-03-10T00:00:00Z')))
    const capped = capPerDay(plan, new Map([['2026-03-10', TESTS_PER_TANK_PER_DAY]]))
    expect(capped.rows.takenAt.every(t => t.startsWith('2026-03-11'))).toBe(true)
    expect(capped.rows.length).toBe(24)
    // The columns keep each row's values with it.
    expect(capped.rows.valuesOf(0).ammoniaN).toBe(plan.rows.valuesOf(24).ammoniaN)
    expect(capped.rows.value(0, 'nitriteN')).toBeNull()
  })
})

describe('import key numbers', () => {
  it('writes each value as the text of csvNumber, short or long', () => {
    const values = [0, -0, 0.1, 0.25, 1, 2.5, 8.2, 25.4, 34.5, 123456789, 1234567891, 0.123456789, 0.1234567891, 1 / 3, 2 / 3, 1e-7, 1.5e21, -0.000123, 0.1 + 0.2, 35.000000001]
    // Conversions leave float noise of every length: the fast path must agree with the slow one on all of it.
    for (let i = 0; i < 2000; i++) values.push(Math.round(Math.sin(i) * 10 ** (i % 12)) / 10 ** (i % 7), Math.sin(i) * 17.0307 / 14.0067)
    for (const value of values) expect(csvNumberText(value)).toBe(String(csvNumber(value)))
  })
})
