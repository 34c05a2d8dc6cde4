/**
 * Corrections go through the same physical bounds as readings: a value no reading may
 * hold cannot arrive as a correction either. After a correction every view shows the
 * current value once (the chart, the export, the engine), and the history shows the trail:
 * the replaced value, who replaced it, when and why.
 */
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { PHYSICAL_BOUNDS } from '../../shared/vocabulary'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { events, readings, users } from '../../server/db/schema'
import type { ChartData, EventList, ReadingList } from '../../shared/types/readings'
import { signedIn } from '../support/http'
import { copyTank } from '../support/sign-off-tanks'
import { seedScratchCompany, type ScratchCompany } from '../support/company'

const { demo } = inject('fixtures')
let db: TidewrightDB
let tankId: string
let readingId: string
let trailTankId: string
let co: ScratchCompany
let aquaristName: string

// The copies belong to a scratch company, so the demo company's tank counts (which other
// files assert) stay as the fixtures describe them.
beforeAll(async () => {
  co = await seedScratchCompany('corrections')
  db = openDatabase(inject('dbPath'))
  const owners = { organisationId: co.organisationId, clientId: co.clientId, siteId: co.siteId, aquaristId: co.ids.aquarist, supervisorId: co.ids.supervisor }
  tankId = copyTank(db, demo.tanks.lounge, 'Correction bounds lounge', owners)
  readingId = db.select().from(readings).where(eq(readings.tankId, tankId)).all().find(r => r.temperatureC !== null)!.id
  trailTankId = copyTank(db, demo.tanks.lounge, 'Correction trail lounge', owners)
  aquaristName = db.select().from(users).where(eq(users.id, co.ids.aquarist)).get()!.name
})
afterAll(() => db?.$client.close())

describe('a correction of a reading', () => {
  it('refuses a temperature a reading refuses (44 C), naming the field', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
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
    const aquarist = await signedIn(co.emails.aquarist)
    const [min] = PHYSICAL_BOUNDS.temperatureC
    const { status, body } = await aquarist.post(`/api/tanks/${tankId}/readings/${readingId}/corrections`, { temperatureC: min, salinity: PHYSICAL_BOUNDS.salinity[1], reason: 'Read the wrong meter' })
    expect(status).toBe(201)
    expect(body).toMatchObject({ temperatureC: min, salinity: PHYSICAL_BOUNDS.salinity[1] })
  })
})

describe('a correction of an event', () => {
  // The event form's rules (shared/readings/events.ts) hold for a correction too: a dose
  // above any cycling dose, a part of an animal, a note without words.
  const addEvent = (values: Partial<typeof events.$inferInsert> & Pick<typeof events.$inferInsert, 'kind'>) =>
    db.insert(events).values({ tankId, at: new Date(Date.now() - 86_400_000).toISOString(), ...values }).returning().get().id

  it('refuses a dose the event form refuses (9999 and 25 mg/L as N), naming the field', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
    const form = await aquarist.post(`/api/tanks/${tankId}/events`, { at: new Date().toISOString(), kind: 'ammonia-dose', amount: 9999, doseBasis: 'N' })
    expect(form.status).toBe(400)
    const dose = addEvent({ kind: 'ammonia-dose', amount: 2 })
    for (const amount of [9999, 25, 0]) {
      const correction = await aquarist.post(`/api/tanks/${tankId}/events/${dose}/corrections`, { amount, reason: 'Typed the dose wrong' })
      console.log(`[corrections] ammonia-dose correction to ${amount} mg/L as N: ${correction.status}`)
      expect(correction.status).toBe(400)
      expect(correction.body.data.issues[0].field).toBe('amount')
    }
    const patched = await aquarist.patch(`/api/tanks/${tankId}/events/${dose}`, { amount: 9999 })
    expect(patched.status).toBe(400)
    expect(db.select().from(events).where(eq(events.correctsId, dose)).all()).toHaveLength(0)
    expect(db.select().from(events).where(eq(events.id, dose)).get()?.amount).toBe(2)
  })

  it('refuses livestock counts the form refuses (2.5, 5000) and a note emptied of words', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
    const fish = addEvent({ kind: 'livestock-added', group: 'fish', amount: 2 })
    for (const amount of [2.5, 5000]) {
      const correction = await aquarist.post(`/api/tanks/${tankId}/events/${fish}/corrections`, { amount, reason: 'Counted again' })
      console.log(`[corrections] livestock correction to ${amount}: ${correction.status}`)
      expect(correction.status).toBe(400)
      expect(correction.body.data.issues[0].field).toBe('amount')
    }
    const note = addEvent({ kind: 'note', notes: 'Skimmer cup emptied' })
    const emptied = await aquarist.post(`/api/tanks/${tankId}/events/${note}/corrections`, { notes: null, reason: 'Wrong tank' })
    expect(emptied.status).toBe(400)
    expect(emptied.body.data.issues[0].field).toBe('notes')
    expect(db.select().from(events).where(eq(events.correctsId, fish)).all()).toHaveLength(0)
    expect(db.select().from(events).where(eq(events.correctsId, note)).all()).toHaveLength(0)
  })

  it('accepts what the form accepts, in canonical units, and keeps a dose free of a livestock group', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
    const dose = addEvent({ kind: 'ammonia-dose', amount: 2 })
    const { status, body } = await aquarist.post(`/api/tanks/${tankId}/events/${dose}/corrections`, { amount: 20, group: 'fish', reason: 'Dosed the full amount' })
    expect(status).toBe(201)
    expect(body).toMatchObject({ kind: 'ammonia-dose', amount: 20, group: null, correctsId: dose })
  })
})

describe('a correction of a reading that clears every value', () => {
  it('is refused like an empty form: a reading holds at least one result or a note', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
    const original = db.select().from(readings).where(eq(readings.tankId, tankId)).all().find(r => r.correctsId === null && r.id !== readingId)!
    const cleared = Object.fromEntries(Object.keys(PHYSICAL_BOUNDS).map(field => [field, null]))
    const correction = await aquarist.post(`/api/tanks/${tankId}/readings/${original.id}/corrections`, { ...cleared, notes: null, reason: 'Nothing was measured' })
    console.log(`[corrections] reading correction clearing every value: ${correction.status}`)
    expect(correction.status).toBe(400)
    expect(db.select().from(readings).where(eq(readings.correctsId, original.id)).all()).toHaveLength(0)
  })
})

describe('after a correction', () => {
  it('the chart and the export show one value, the new one; the history shows the trail', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
    const original = db.select().from(readings).where(eq(readings.tankId, trailTankId)).all().find(r => r.ammoniaN !== null && r.ammoniaN > 0.1)!
    const before = await aquarist.get<ChartData>(`/api/tanks/${trailTankId}/chart`)
    const pointsBefore = before.body.t.length
    const at = Math.round(Date.parse(original.takenAt) / 1000)

    const corrected = await aquarist.post(`/api/tanks/${trailTankId}/readings/${original.id}/corrections`, { ammoniaN: 0.05, reason: 'Read against the wrong colour card' })
    expect(corrected.status).toBe(201)

    const chart = (await aquarist.get<ChartData>(`/api/tanks/${trailTankId}/chart`)).body
    expect(chart.t).toHaveLength(pointsBefore)
    const at_ = chart.t.flatMap((t, i) => (t === at ? [i] : []))
    expect(at_).toHaveLength(1)
    expect(chart.ammoniaN[at_[0]!]).toBe(0.05)

    const csv = (await aquarist.get<string>(`/api/tanks/${trailTankId}/readings/export.csv`)).body.trim().split('\n')
    const rows = csv.filter(line => line.startsWith(original.takenAt))
    expect(rows).toHaveLength(1)
    expect(rows[0]!.split(',')[1]).toBe('0.05')
    expect(csv).toHaveLength(pointsBefore + 1)

    const history = (await aquarist.get<ReadingList>(`/api/tanks/${trailTankId}/readings?pageSize=500`)).body
    const replaced = history.items.find(r => r.id === original.id)!
    const current = history.items.find(r => r.id === corrected.body.id)!
    expect(replaced).toMatchObject({
      ammoniaN: original.ammoniaN, current: false, canEdit: false,
      replacedBy: { id: corrected.body.id, reason: 'Read against the wrong colour card', byName: aquaristName },
    })
    expect(Date.parse(replaced.replacedBy!.at)).not.toBeNaN()
    expect(current).toMatchObject({ ammoniaN: 0.05, current: true, replacedBy: null, correctsId: original.id, correctionReason: 'Read against the wrong colour card', enteredByName: aquaristName })
    expect(history.total).toBe(pointsBefore + 1)
  })

  it('the chart shows a corrected event once, with the new amount; the event history shows the trail', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
    const events = (await aquarist.get<EventList>(`/api/tanks/${trailTankId}/events?pageSize=500`)).body
    const dose = events.items.find(e => e.kind === 'ammonia-dose')!
    const eventsBefore = (await aquarist.get<ChartData>(`/api/tanks/${trailTankId}/chart`)).body.events.length
    const corrected = await aquarist.post(`/api/tanks/${trailTankId}/events/${dose.id}/corrections`, { amount: 0.5, reason: 'Dosed half the planned amount' })
    expect(corrected.status).toBe(201)
    const chart = (await aquarist.get<ChartData>(`/api/tanks/${trailTankId}/chart`)).body
    expect(chart.events).toHaveLength(eventsBefore)
    const at = Math.round(Date.parse(dose.at) / 1000)
    expect(chart.events.filter(e => e.t === at && e.kind === 'ammonia-dose').map(e => e.amount)).toEqual([0.5])
    const after = (await aquarist.get<EventList>(`/api/tanks/${trailTankId}/events?pageSize=500`)).body
    expect(after.items.find(e => e.id === dose.id)).toMatchObject({ current: false, replacedBy: { id: corrected.body.id, reason: 'Dosed half the planned amount' } })
    expect(after.items.find(e => e.id === corrected.body.id)).toMatchObject({ current: true, amount: 0.5, correctsId: dose.id, correctionReason: 'Dosed half the planned amount' })
  })
})
