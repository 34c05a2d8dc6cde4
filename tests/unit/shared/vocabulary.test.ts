/**
 * The vocabulary is the one home of every fixed list: the database enums are the same
 * lists, and no source file spells a list out a second time.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'
import { getTableColumns } from 'drizzle-orm'
import * as schema from '../../../server/db/schema'
import * as vocabulary from '../../../shared/vocabulary'

const ROOT = join(__dirname, '../../..')

describe('the database schema', () => {
  it.each([
    ['users.role', schema.users.role, vocabulary.ROLES],
    ['users.units', schema.users.units, vocabulary.UNIT_SYSTEMS],
    ['tanks.status', schema.tanks.status, vocabulary.TANK_STATUSES],
    ['tanks.shape', schema.tanks.shape, vocabulary.TANK_SHAPES],
    ['tanks.material', schema.tanks.material, vocabulary.TANK_MATERIALS],
    ['tanks.waterSource', schema.tanks.waterSource, vocabulary.WATER_SOURCES],
    ['tanks.cycleMethod', schema.tanks.cycleMethod, vocabulary.CYCLE_METHODS],
    ['planStages.status', schema.planStages.status, vocabulary.STAGE_STATUSES],
    ['events.kind', schema.events.kind, vocabulary.EVENT_KINDS],
    ['events.group', schema.events.group, vocabulary.LIVESTOCK_GROUPS],
    ['tankVerdicts.phase', schema.tankVerdicts.phase, vocabulary.CYCLE_PHASES],
    ['alerts.status', schema.alerts.status, vocabulary.ALERT_STATUSES],
    ['mailOutbox.status', schema.mailOutbox.status, vocabulary.MAIL_STATUSES],
    ['authTokens.purpose', schema.authTokens.purpose, vocabulary.AUTH_TOKEN_PURPOSES],
    ['signOffs.status', schema.signOffs.status, vocabulary.SIGN_OFF_STATUSES],
    ['salinityInstruments.mode', schema.salinityInstruments.mode, vocabulary.SALINITY_MODES],
  ])('%s takes its values from the vocabulary', (_name, column, list) => {
    expect(column.enumValues).toEqual([...list])
  })

  it('has no text enum that is not a vocabulary list', () => {
    const lists = Object.values(vocabulary).filter(Array.isArray).map(l => JSON.stringify(l))
    const tables = Object.values(schema).filter(t => typeof t === 'object' && t !== null && Symbol.for('drizzle:IsDrizzleTable') in t)
    const enums = tables.flatMap(t => Object.values(getTableColumns(t as typeof schema.tanks)))
      .map(c => (c as { enumValues?: string[] }).enumValues)
      .filter((values): values is string[] => Array.isArray(values) && values.length > 0)
    expect(enums.length).toBeGreaterThanOrEqual(15)
    for (const values of enums) expect(lists).toContain(JSON.stringify(values))
  })
})

describe('physical bounds', () => {
  it('give every measured field a range whose minimum is below its maximum', () => {
    expect(Object.keys(vocabulary.PHYSICAL_BOUNDS).sort()).toEqual([...vocabulary.MEASURED_FIELDS].sort())
    for (const [min, max] of Object.values(vocabulary.PHYSICAL_BOUNDS)) expect(min).toBeLessThan(max)
  })
})

/** Every .ts and .vue file under the given folders. */
function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    if (statSync(path).isDirectory()) return sourceFiles(path)
    return /\.(ts|vue)$/.test(name) ? [path] : []
  })
}

/**
 * A list is "written again" when three of its values (all of them, for shorter lists; or
 * `width`) appear next to each other as quoted literals joined by `,` or `|`, in the list's order.
 */
function copyPattern(list: readonly string[], width = Math.min(3, list.length), counts: (window: readonly string[]) => boolean = () => true): RegExp {
  const quoted = (s: string) => `['"]${s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}['"]`
  const windows = list.slice(0, list.length - width + 1).map((_, i) => list.slice(i, i + width)).filter(counts)
    .map(window => window.map(quoted).join('\\s*[,|]\\s*'))
  return new RegExp(windows.join('|'))
}

/**
 * The entry fields share their reef chemistry, pH and salinity names with the canonical measured
 * fields: three in a row of those may be a canonical list (a sign-off's final readings). A copy of
 * an entry list is a run that names at least one field only an entry has (ammonia, temperature).
 */
const CANONICAL_NAMES: ReadonlySet<string> = new Set(vocabulary.MEASURED_FIELDS)
const namesAnEntryField = (window: readonly string[]) => window.some(name => !CANONICAL_NAMES.has(name))
const COUNTED_RUNS: Record<string, (window: readonly string[]) => boolean> = {
  INPUT_FIELDS: namesAnEntryField,
  DAILY_INPUT_FIELDS: namesAnEntryField,
}

/**
 * Lists whose values also appear, legitimately, outside the vocabulary: measured field
 * names are column and property names everywhere; the unit converter speaks of kelvin
 * and converts between any two units, so it names C, F, L and usgal as arguments.
 */
const ELSEWHERE: Record<string, (path: string) => boolean> = {
  MEASURED_FIELDS: () => true,
  // Reef chemistry is entered under its canonical names: those are MEASURED_FIELDS too.
  REEF_INPUT_FIELDS: () => true,
  TEMPERATURE_UNITS: path => path === 'shared/units.ts',
  VOLUME_UNITS: path => path === 'shared/units.ts',
}

describe('the source', () => {
  // A retired rule set (shared/cycle/v1) stays exactly as it was when verdicts were signed under it.
  const files = ['app', 'server', 'shared'].flatMap(dir => sourceFiles(join(ROOT, dir)))
    .filter(path => !path.endsWith(join('shared', 'vocabulary.ts')) && !path.includes(join('shared', 'cycle', 'v1')))
  const lists = (Object.entries(vocabulary) as [string, unknown][]).filter((entry): entry is [string, readonly string[]] => Array.isArray(entry[1]))

  it('reads at least the known folders', () => {
    expect(files.length).toBeGreaterThan(100)
  })

  it.each(lists)('spells out %s only in shared/vocabulary.ts', (name, list) => {
    const pattern = copyPattern(list, undefined, COUNTED_RUNS[name])
    const allowed = ELSEWHERE[name] ?? (() => false)
    const copies = files.map(path => relative(ROOT, path)).filter(path => !allowed(path) && pattern.test(readFileSync(join(ROOT, path), 'utf8')))
    expect(copies).toEqual([])
  })

  // Measured field names stand everywhere as column and property names, and a few of them in a
  // row in lists of their own (a sign-off's final readings, the kit-free entry fields); the whole
  // list in its order is the list itself.
  it('spells out MEASURED_FIELDS whole only in shared/vocabulary.ts', () => {
    const pattern = copyPattern(vocabulary.MEASURED_FIELDS, vocabulary.MEASURED_FIELDS.length)
    const copies = files.map(path => relative(ROOT, path)).filter(path => pattern.test(readFileSync(join(ROOT, path), 'utf8')))
    expect(copies).toEqual([])
    expect(pattern.test(`const KEYS = ['ammoniaN', 'nitriteN', 'nitrateN', 'pH', 'temperatureC', 'salinity',\n  'alkalinityDkh', 'calciumMgL', 'magnesiumMgL', 'phosphateMgL']`)).toBe(true)
  })

  it('would find a copy if one were written', () => {
    expect(copyPattern(vocabulary.TANK_STATUSES).test(`status: 'planned' | 'building' | 'cycling'`)).toBe(true)
    expect(copyPattern(vocabulary.UNIT_SYSTEMS).test(`units: 'us' | 'metric'`)).toBe(true)
    expect(copyPattern(vocabulary.LIVESTOCK_GROUPS).test(`['fish', 'invertebrates', 'soft-coral']`)).toBe(true)
    const inputs = copyPattern(vocabulary.INPUT_FIELDS, undefined, namesAnEntryField)
    expect(inputs.test(`const TYPED = ['ammonia', 'nitrite', 'nitrate', 'pH']`)).toBe(true)
    expect(inputs.test(`field: 'temperature' | 'salinity' | 'alkalinityDkh'`)).toBe(true)
    expect(inputs.test(`['pH', 'temperatureC', 'salinity', 'alkalinityDkh', 'calciumMgL']`)).toBe(false)
  })
})
