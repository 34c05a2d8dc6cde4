/**
 * What the CSV import stores for each row it takes, as readings keep it: the import key
 * (a file imported before must be recognised again, so its form may never change) and the
 * entered record (the JSON text of what was typed). Both spelled out here byte for byte,
 * across every basis, unit and salinity mode, numbers short and long, -0 and exponents.
 */
import { hash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { planImport, type ImportRow, type ImportSink } from '../../../../shared/readings/import-plan'
import type { ReadingImportInput } from '../../../../shared/schemas/reading'

const context = { kit: { ammonia: 'N', nitrite: 'N', nitrate: 'N' } as const, lockedMs: Number.NEGATIVE_INFINITY, now: new Date('2026-06-01T00:00:00Z') }

/** The rows the import hands on, into a tank that already holds `keys`; and its plan. */
function imported(input: ReadingImportInput, keys: string[] = []) {
  const taken: ImportRow[] = []
  const held = new Set(keys)
  const sink: ImportSink = {
    heldOnDay: () => 0,
    holds: row => held.has(row.key),
    add: (row) => {
      if (held.has(row.key)) return false
      held.add(row.key)
      taken.push(row)
      return true
    },
  }
  const outcome = planImport([input.csv], input, context, sink)
  if (outcome.kind !== 'plan') throw new Error(outcome.kind)
  return { taken, plan: outcome.plan }
}

/** The stored key: the first 32 hex digits of the SHA-256 of the time, the ten canonical values (nine significant digits) and the notes, joined by '|'. */
const keyOf = (normalised: string) => hash('sha256', normalised, 'hex').slice(0, 32)

// Kit bases as ions, degrees F, specific gravity: every value but pH and the last four converted.
const ionFile: ReadingImportInput = {
  csv: 'when,NH3,NO2,NO3,pH,temp F,SG,alk,ca,mg,po4,notes\n'
    + '2026-03-10 08:30,0.5,0.25,10,8.1,77,1.025,8.5,420,1300,0.03,"first week, cloudy"\n'
    + '2026-03-11,0,,0.333333333333,,78.2,,,,,,\n'
    + '2026-03-12T07:15:00+02:00,1.000,,,8.20,,1.0264,,,,,  "quoted" \\ back  \n',
  mapping: { takenAt: 'when', ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3', temperature: 'temp F', salinity: 'SG', alkalinityDkh: 'alk', calciumMgL: 'ca', magnesiumMgL: 'mg', phosphateMgL: 'po4' },
  basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
  temperatureUnit: 'F',
  salinityMode: 'sg',
  sgBasis: '77/60F',
  dryRun: true,
}

// Ammonia as NH4, the rest as N, degrees C, conductivity; a long pH, -0, an exponent, a note with a tab and quotes.
const nitrogenFile: ReadingImportInput = {
  csv: 'takenAt,ammonia,nitrite,nitrate,pH,temperature,salinity,phosphate,notes\n'
    + '2026-03-10T08:30:00Z,2,0.5,3,8.123456789012,-0,53,1e-7,\n'
    + '2026-03-10T09:30:00.5Z,0.1,,,,24.5,,,"tab\tand ""quote"""\n',
  mapping: {},
  basis: { ammonia: 'NH4', nitrite: 'N', nitrate: 'N' },
  temperatureUnit: 'C',
  salinityMode: 'conductivity',
  dryRun: true,
}

describe('the import key', () => {
  it('keeps the form every key stored so far has', () => {
    expect(imported(ionFile).taken.map(r => r.key)).toEqual([
      keyOf('2026-03-10T08:30:00.000Z|0.411223706|0.0761144201|2.25897162|8.1|25|35.8592776|8.5|420|1300|0.03|first week, cloudy'),
      keyOf('2026-03-11T12:00:00.000Z|0||0.0752990541||25.6666667||||||'),
      keyOf('2026-03-12T05:15:00.000Z|0.822447412|||8.2||37.7079684|||||"quoted" \\ back'),
    ])
    expect(imported(nitrogenFile).taken.map(r => r.key)).toEqual([
      keyOf('2026-03-10T08:30:00.000Z|1.55298279|0.5|3|8.12345679|0|34.9472993||||1e-7|'),
      keyOf('2026-03-10T09:30:00.500Z|0.0776491393||||24.5||||||tab\tand "quote"'),
    ])
  })

  it('finds every row of a file imported before a duplicate', () => {
    for (const file of [ionFile, nitrogenFile]) {
      const first = imported(file)
      const again = imported(file, first.taken.map(r => r.key))
      expect([again.plan.added, again.plan.duplicates, again.plan.errorCount]).toEqual([0, first.taken.length, 0])
    }
  })
})

describe('the entered record', () => {
  it('is the JSON of what was typed, in the order and form the readings hold', () => {
    expect(imported(ionFile).taken.map(r => r.entered)).toEqual([
      '{"ammonia":{"value":0.5,"basis":"NH3"},"nitrite":{"value":0.25,"basis":"NO2"},"nitrate":{"value":10,"basis":"NO3"},"pH":8.1,"temperature":{"value":77,"unit":"F"},"salinity":{"value":1.025,"as":"sg","basis":"77/60F"},"alkalinityDkh":8.5,"calciumMgL":420,"magnesiumMgL":1300,"phosphateMgL":0.03,"source":"csv"}',
      '{"ammonia":{"value":0,"basis":"NH3"},"nitrate":{"value":0.333333333333,"basis":"NO3"},"temperature":{"value":78.2,"unit":"F"},"source":"csv"}',
      '{"ammonia":{"value":1,"basis":"NH3"},"pH":8.2,"salinity":{"value":1.0264,"as":"sg","basis":"77/60F"},"source":"csv"}',
    ])
    expect(imported(nitrogenFile).taken.map(r => r.entered)).toEqual([
      '{"ammonia":{"value":2,"basis":"NH4"},"nitrite":{"value":0.5,"basis":"N"},"nitrate":{"value":3,"basis":"N"},"pH":8.123456789012,"temperature":{"value":0,"unit":"C"},"salinity":{"value":53,"as":"conductivity","temperatureC":25},"phosphateMgL":1e-7,"source":"csv"}',
      '{"ammonia":{"value":0.1,"basis":"NH4"},"temperature":{"value":24.5,"unit":"C"},"source":"csv"}',
    ])
  })
})
