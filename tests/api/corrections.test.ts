/**
 * Corrections go through the same physical bounds as readings: a value no reading may
 * hold cannot arrive as a correction either.
 */
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { PHYSICAL_BOUNDS } from '../../shared/vocabulary'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { readings } from '../../server/db/schema'
import { signedIn } from '../support/http'
import { copyTank } from '../support/sign-off-tanks'

const { demo } = inject('fixtures')
let db: TidewrightDB
let tankId: string
let readingId: string

beforeAll(() => {
  db = openDatabase(inject('dbPath'))
  tankId = copyTank(db, demo.tanks.lounge, 'Correction bounds lounge')
  readingId = db.select().from(readings).where(eq(readings.tankId, tankId)).all().find(r => r.temperatureC !== null)!.id
})
afterAll(() => db?.$client.close())

describe('a correction of a reading', () => {
  it('refuses a temperature a reading refuses (44 C), naming the field', async () => {
    const aquarist = await signedIn('aquarist@tidewright.test')
    const reading = await aquarist.post(`/api/tanks/${tankId}/readings`, {
      takenAt: new Date().toISOString(), temperature: 44, temperatureUnit: 'C', salinityMode: 'practical',
      basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
    })
    expect(reading.status).toBe(400)
    const correction = await aquarist.post(`/api/tanks/${tankId}/readings/${readingId}/corrections`, { temperatureC: 44, reason: 'Heater stuck on' })
    expect(correction.status).toBe(400)
    expect(correction.body.data.issues[0].field).toBe('temperatureC')
    expect(db.select().from(readings).where(eq(readings.correctsId, readingId)).all()).toHaveLength(0)
  })

  it('accepts every value at the physical bounds a reading accepts', async () => {
    const aquarist = await signedIn('aquarist@tidewright.test')
    const [min] = PHYSICAL_BOUNDS.temperatureC
    const { status, body } = await aquarist.post(`/api/tanks/${tankId}/readings/${readingId}/corrections`, { temperatureC: min, salinity: PHYSICAL_BOUNDS.salinity[1], reason: 'Read the wrong meter' })
    expect(status).toBe(201)
    expect(body).toMatchObject({ temperatureC: min, salinity: PHYSICAL_BOUNDS.salinity[1] })
  })
})
