/**
 * The CSV import's pure half: the row cap refuses a file one row too long (and stops
 * parsing there), the day cap keeps a day's first rows up to the room left, a test already
 * held takes no room, and each row that passes is handed on as it is read.
 */
import { describe, expect, it } from 'vitest'
import { MAX_REPORTED_ERRORS, planImport, type ImportPlan, type ImportRow, type ImportSink } from '../../../../shared/readings/import-plan'
import { dayOf, MAX_IMPORT_ROWS, TESTS_PER_TANK_PER_DAY } from '../../../../shared/readings/limits'
import { csvNumber, csvNumberText } from '../../../../shared/readings/csv'

const context = { kit: { ammonia: 'N', nitrite: 'N', nitrate: 'N' } as const, lockedMs: Number.NEGATIVE_INFINITY, now: new Date('2026-06-01T00:00:00Z') }
const input = (csv: string) => [[csv], { mapping: {}, temperatureUnit: 'C' as const, salinityMode: 'practical' as const }] as const
const hourly = (count: number, start = Date.parse('2016-01-01T00:00:00Z')) =>
  `takenAt,ammonia\n${Array.from({ length: count }, (_, i) => `${new Date(start + i * 3_600_000).toISOString()},0.25`).join('\n')}`

/** A tank in memory: what it held per day and by key before, and the rows the import hands it. */
function memoryTank(held: Record<string, number> = {}, keys: string[] = []) {
  const taken: ImportRow[] = []
  const keySet = new Set(keys)
  const asked: string[] = []
  const sink: ImportSink = {
    heldOnDay: (day) => {
      asked.push(day)
      return held[day] ?? 0
    },
    holds: row => keySet.has(row.key),
    add: (row) => {
      if (keySet.has(row.key)) return false
      keySet.add(row.key)
      taken.push(row)
      return true
    },
  }
  return { sink, taken, asked }
}

const planOf = (csv: string, tank = memoryTank()): ImportPlan => {
  const outcome = planImport(...input(csv), context, tank.sink)
  if (outcome.kind !== 'plan') throw new Error(outcome.kind)
  return outcome.plan
}

describe('rows per import', () => {
  it('takes a file of exactly the cap and refuses one row more', () => {
    expect(planImport(...input(hourly(MAX_IMPORT_ROWS)), context, memoryTank().sink).kind).toBe('plan')
    expect(planImport(...input(hourly(MAX_IMPORT_ROWS + 1)), context, memoryTank().sink).kind).toBe('too-many-rows')
  })
})

describe('what an import keeps of its rows', () => {
  it('keeps the first errors and the first rows taken, however many there are, and counts them all', () => {
    // Each good row followed by three bad ones: 4,000 errors, 1,000 rows taken.
    const rows = Array.from({ length: 1000 }, (_, i) => [`${new Date(Date.parse('2020-01-01T00:00:00Z') + i * 3_600_000).toISOString()},0.25`, 'not a date,1', `${new Date(Date.parse('2020-01-01T00:00:00Z') + i * 3_600_000).toISOString()},-1`, ',1']).flat()
    const tank = memoryTank()
    const plan = planOf(`takenAt,ammonia\n${rows.join('\n')}`, tank)
    expect([plan.rowCount, plan.added, plan.errorCount]).toEqual([4000, 1000, 3000])
    expect(plan.errors).toHaveLength(MAX_REPORTED_ERRORS)
    expect(plan.errors.map(e => e.row)).toEqual([...plan.errors.map(e => e.row)].sort((a, b) => a - b))
    expect(plan.errors[0]!.row).toBe(3)
    expect(plan.preview).toHaveLength(20)
    expect(plan.preview.map(p => p.row)).toEqual(Array.from({ length: 20 }, (_, i) => 2 + 4 * i))
    expect(tank.taken).toHaveLength(1000)
  })
})

describe('tests per day', () => {
  it('keeps the first rows of a day up to the room it has left and reports the rest', () => {
    const tank = memoryTank({ '2026-03-10': TESTS_PER_TANK_PER_DAY - 3 })
    const plan = planOf(hourly(24, Date.parse('2026-03-10T00:00:00Z')), tank)
    expect(tank.taken.map(r => r.line)).toEqual([2, 3, 4])
    expect(plan.added).toBe(3)
    expect(plan.errorCount).toBe(21)
    expect(plan.errors[0]).toMatchObject({ row: 5, field: 'takenAt' })
    expect(plan.errors[0]!.message).toContain('2026-03-10')
    // The tank is asked once per day, not once per row.
    expect(tank.asked).toEqual(['2026-03-10'])
  })

  it('counts each day on its own', () => {
    const tank = memoryTank({ '2026-03-10': TESTS_PER_TANK_PER_DAY })
    const plan = planOf(hourly(48, Date.parse('2026-03-10T00:00:00Z')), tank)
    expect(tank.taken.every(r => dayOf(r.takenAt) === '2026-03-11')).toBe(true)
    expect(plan.added).toBe(24)
    expect(tank.taken[0]!.values.ammoniaN).toBe(0.25)
    expect(tank.taken[0]!.values.nitriteN).toBeNull()
    expect(plan.preview[0]).toMatchObject({ row: 26, takenAt: '2026-03-11T00:00:00.000Z', ammoniaN: 0.25, nitriteN: null })
  })

  it('takes no room for a test already held, even on a full day', () => {
    const csv = hourly(3, Date.parse('2026-03-10T00:00:00Z'))
    const first = memoryTank()
    planOf(csv, first)
    const keys = first.taken.map(r => r.key)
    // The day has room for one more; the file's first two rows are already held.
    const tank = memoryTank({ '2026-03-10': TESTS_PER_TANK_PER_DAY - 1 }, keys.slice(0, 2))
    const plan = planOf(csv, tank)
    expect(plan.duplicates).toBe(2)
    expect(plan.added).toBe(1)
    expect(plan.errorCount).toBe(0)
    // Full before the file: the held rows are still duplicates, the new one is refused.
    const full = memoryTank({ '2026-03-10': TESTS_PER_TANK_PER_DAY }, keys.slice(0, 2))
    const refused = planOf(csv, full)
    expect([refused.duplicates, refused.added, refused.errorCount]).toEqual([2, 0, 1])
    expect(refused.errors[0]).toMatchObject({ row: 4, field: 'takenAt' })
  })

  it('counts a row repeated in the file once', () => {
    const row = '2026-03-10T08:00:00.000Z,0.25'
    const plan = planOf(`takenAt,ammonia\n${row}\n${row}\n${row}`)
    expect([plan.rowCount, plan.added, plan.duplicates]).toEqual([3, 1, 2])
  })
})

describe('refused rows', () => {
  it('reports every refused row in file order with its field, and hands on only the rows that pass', () => {
    const tank = memoryTank()
    const plan = planOf('takenAt,ammonia,pH\n2026-03-10T08:00:00Z,0.25,8.1\nyesterday,0.25,8.1\n2026-03-11T08:00:00Z,abc,8.1\n2026-03-12T08:00:00Z,0.25,15\n2026-03-13T08:00:00Z,0.5,8.2', tank)
    expect(plan.errors.map(e => [e.row, e.field])).toEqual([[3, 'takenAt'], [4, 'ammonia'], [5, 'pH']])
    expect(plan.errorCount).toBe(3)
    expect(tank.taken.map(r => r.line)).toEqual([2, 6])
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
