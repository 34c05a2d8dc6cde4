/**
 * The alert lifecycle through the real server: readings posted to POST /api/tanks/:id/readings
 * open, update and clear alerts; e-mail goes out through the real SMTP catcher; escalation
 * and reminders run at an injected time (POST /api/dev/worker-tick, test hooks only).
 * Thresholds: total ammonia above 0.5 ppm as NH3 with fish in calls for a water change
 * (common practice, no published source).
 */
import { describe, expect, inject, it } from 'vitest'
import type { AlertView, NotificationList } from '../../shared/types/alerts'
import { ApiClient, signedIn } from '../support/http'
import { OTHER_AQUARIST_EMAIL } from '../support/fixtures'
import { caughtMail, tick, waitForMail } from '../support/mail'
import type { CaughtMail } from '../../scripts/mail-catcher'

const { demo } = inject('fixtures')
const study = demo.tanks.study
const MINUTE = 60_000
let minuteOffset = 30

/** A full test session on the study reef; each call is a minute later than the last, all in the past. */
function reading(ammoniaPpmNH3: number) {
  minuteOffset -= 1
  return {
    takenAt: new Date(Date.now() - minuteOffset * MINUTE).toISOString(),
    ammonia: ammoniaPpmNH3, nitrite: 0.3, nitrate: 5,
    basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
    pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
  }
}
// 1.5 ppm NH3 is 1.23 mg/L as N: over the action level, while free ammonia at pH 8.1 and 25 C stays under the acute limit.
const BAD = 1.5
const CLEAR = 0

async function post(api: ApiClient, ammonia: number) {
  const response = await api.post(`/api/tanks/${study}/readings`, reading(ammonia))
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  return response.body.reading.id as string
}

async function studyAlerts(api: ApiClient, status = ''): Promise<AlertView[]> {
  const response = await api.get<{ items: AlertView[] }>(`/api/alerts?tankId=${study}${status ? `&status=${status}` : ''}`)
  expect(response.status).toBe(200)
  return response.body.items
}

const openedMail = (mail: CaughtMail[], alertId: string) => mail.filter(m => m.messageId === `<alert-${alertId}-opened@mail.tidewright.invalid>`)
const clientMail = (mail: CaughtMail[], alertId: string) => mail.filter(m => m.messageId.startsWith(`<alert-${alertId}-client-`))
const escalatedMail = (mail: CaughtMail[], alertId: string) => mail.filter(m => m.messageId.startsWith(`<alert-${alertId}-escalated-`))

describe('GET /api/alerts', () => {
  it('shows staff the seeded ammonia alert on the study reef, and nobody else\'s', async () => {
    const aquarist2 = await signedIn('aquarist2@tidewright.test')
    const items = await studyAlerts(aquarist2, 'active')
    expect(items).toHaveLength(1)
    expect(items[0]).toMatchObject({ tankName: 'Fernhill study reef', status: 'open', kind: 'ammonia.action-threshold' })
    const theirs = await signedIn(OTHER_AQUARIST_EMAIL)
    expect((await theirs.get<{ items: AlertView[] }>('/api/alerts')).body.items.some(a => a.tankId === study)).toBe(false)
  })

  it('is 401 signed out, 403 for clients, 400 for a bad filter', async () => {
    expect((await new ApiClient().get('/api/alerts')).status).toBe(401)
    expect((await (await signedIn('client3@tidewright.test')).get('/api/alerts')).status).toBe(403)
    const bad = await (await signedIn('aquarist@tidewright.test')).get('/api/alerts?status=panic')
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].field).toBe('status')
  })

  it('e-mailed the seeded alert to the assigned aquarist only', async () => {
    const [alert] = await studyAlerts(await signedIn('aquarist2@tidewright.test'), 'open')
    const mail = await waitForMail('seeded alert e-mail', all => openedMail(all, alert!.id).length > 0 && all)
    expect(openedMail(mail, alert!.id).map(m => m.envelopeTo)).toEqual([['aquarist2@tidewright.test']])
  })
})

describe('alerts from readings', () => {
  let alertId = ''
  let openedAt = 0

  it('a clearing reading resolves the alert; a bad one opens exactly one alert and one e-mail to the assigned aquarist', async () => {
    const client3 = await signedIn('client3@tidewright.test')
    const aquarist2 = await signedIn('aquarist2@tidewright.test')
    const [seeded] = await studyAlerts(aquarist2, 'active')
    // Preferences cannot switch the danger e-mail off for the assigned aquarist.
    expect((await aquarist2.request('PUT', '/api/me/notification-preferences', { emailKinds: { 'alert-opened': false, 'alert-resolved': false } })).status).toBe(200)
    const prefs = (await aquarist2.get('/api/me/notification-preferences')).body.items
    expect(prefs.find((p: { kind: string }) => p.kind === 'alert-opened')).toMatchObject({ email: true, locked: true })

    await post(client3, CLEAR)
    const cleared = (await studyAlerts(aquarist2)).find(a => a.id === seeded!.id)!
    expect(cleared.status).toBe('resolved')
    expect(cleared.resolveNote).toMatch(/later test/)

    const unreadBefore = (await aquarist2.get<NotificationList>('/api/notifications')).body.unread
    const readingId = await post(client3, BAD)
    const active = await studyAlerts(aquarist2, 'active')
    expect(active).toHaveLength(1)
    expect(active[0]).toMatchObject({ status: 'open', openedByReadingId: readingId, kind: 'ammonia.action-threshold' })
    alertId = active[0]!.id
    openedAt = Date.parse(active[0]!.openedAt)

    const notices = (await aquarist2.get<NotificationList>('/api/notifications')).body
    expect(notices.unread).toBe(unreadBefore + 1)
    expect(notices.items[0]).toMatchObject({ kind: 'alert-opened', alertId, link: `/tanks/${study}` })

    await tick(new Date())
    const mail = await waitForMail('alert e-mail', all => openedMail(all, alertId).length > 0 && all)
    const mine = openedMail(mail, alertId)
    expect(mine).toHaveLength(1)
    expect(mine[0]!.envelopeTo).toEqual(['aquarist2@tidewright.test'])
    expect(mine[0]!.subject).toBe('Danger on Fernhill study reef: act now')
    // What was measured, what it means, what to do, and the link.
    expect(mine[0]!.text).toContain('Total ammonia 1.2 mg/L as N (1.5 ppm as NH3)')
    expect(mine[0]!.text).toContain('What it means:')
    expect(mine[0]!.text).toMatch(/What to do:\n- Change \d+ % of the water/)
    expect(mine[0]!.text).toContain(`/tanks/${study}`)
    // Only the assigned aquarist and the tank's own client heard of it: not the other aquarist, not the other company.
    const aboutIt = await waitForMail('client danger e-mail', all => clientMail(all, alertId).length > 0 && all.filter(m => m.messageId.includes(alertId)))
    expect(aboutIt.flatMap(m => m.envelopeTo).sort()).toEqual(['aquarist2@tidewright.test', 'client3@tidewright.test'])
    // The aquarist switched the "cleared" e-mail off: the notice is in the app, not in the mail.
    expect(notices.items.some(n => n.kind === 'alert-resolved' && n.alertId === seeded!.id)).toBe(true)
    expect(mail.some(m => m.envelopeTo.includes('aquarist2@tidewright.test') && m.subject === 'Cleared: Fernhill study reef')).toBe(false)
  })

  it('tells the tank\'s own client too: a notice and an e-mail in their kit\'s units with plain instructions', async () => {
    const client3 = await signedIn('client3@tidewright.test')
    const notices = (await client3.get<NotificationList>('/api/notifications')).body
    const notice = notices.items.find(n => n.alertId === alertId)
    expect(notice).toMatchObject({ kind: 'tank-danger', title: 'Act now: Fernhill study reef', link: `/tanks/${study}` })
    expect(notice!.body).toMatch(/Change \d+ % of the water/)
    const [mail] = await waitForMail('client danger e-mail', all => clientMail(all, alertId).length > 0 && clientMail(all, alertId))
    expect(mail!.envelopeTo).toEqual(['client3@tidewright.test'])
    expect(mail!.subject).toBe('Your tank Fernhill study reef needs you now')
    // The client's kit reads ammonia as NH3: the value as typed, not mg/L as N.
    expect(mail!.text).toContain('Ammonia 1.5 ppm as NH3')
    expect(mail!.text).not.toContain('mg/L as N')
    expect(notice!.body).not.toContain('mg/L as N')
    expect(mail!.text).toMatch(/What to do:\n- Change \d+ % of the water/)
    // In plain words first, the aquarist's reason (the limit and where it comes from) last, under "Why".
    expect(notice!.body).toMatch(/^Total ammonia is 1\.5 ppm as NH3, as your kit reads it: too high for the animals in the tank\./)
    expect(mail!.text).toContain('What it means:\n- Total ammonia is 1.5 ppm as NH3, as your kit reads it')
    expect(mail!.text).toMatch(/Why:\n- Total ammonia is 1\.5 ppm as NH3 \(test of [^)]+\), above the 0\.5 ppm as NH3 limit/)
    // Fenella reads US units: no litres or degrees Celsius, and moments on the company's clock, not the engine's UTC.
    for (const words of [notice!.body, mail!.text]) {
      expect(words).not.toMatch(/\d L\b|\d C\b|°C/)
      expect(words).not.toMatch(/\d{2}:\d{2} UTC/)
    }
    expect(notice!.body).toMatch(/about [\d.]+ gal/)
    // Other clients of the company hear nothing of it.
    const client = await signedIn('client@tidewright.test')
    expect((await client.get<NotificationList>('/api/notifications')).body.items.some(n => n.alertId === alertId)).toBe(false)
  })

  it('a second bad reading updates the open alert instead of opening another', async () => {
    const client3 = await signedIn('client3@tidewright.test')
    const aquarist2 = await signedIn('aquarist2@tidewright.test')
    const readingId = await post(client3, BAD + 0.5)
    // Rule set 2.0.0 may open the EPA 4-day free-ammonia alert beside it: another kind, its own alert.
    const active = (await studyAlerts(aquarist2, 'active')).filter(a => a.kind === 'ammonia.action-threshold')
    expect(active.map(a => a.id)).toEqual([alertId])
    expect(active[0]!.lastReadingId).toBe(readingId)
    await tick(new Date())
    const dangerMail = (await caughtMail()).filter(m => m.subject === 'Danger on Fernhill study reef: act now' && m.messageId.includes(alertId))
    expect(dangerMail).toHaveLength(1)
  })

  it('escalates to the supervisor once the company\'s delay has passed, and only once', async () => {
    const supervisor = await signedIn('supervisor@tidewright.test')
    // The tick runs for every company on the shared server (other suites seed danger tanks of their own): judge this alert alone.
    await tick(new Date(openedAt + 59 * MINUTE))
    expect((await studyAlerts(supervisor)).find(a => a.id === alertId)!.escalatedAt).toBeNull()

    const due = await tick(new Date(openedAt + 61 * MINUTE))
    // This alert, and any other the same readings opened, escalate once each (the mail below counts this one's).
    expect(due.escalated).toBeGreaterThanOrEqual(1)
    expect((await studyAlerts(supervisor)).find(a => a.id === alertId)!.escalatedAt).not.toBeNull()
    await tick(new Date(openedAt + 120 * MINUTE))
    const mail = await waitForMail('escalation e-mail', all => escalatedMail(all, alertId).length > 0 && all)
    const escalation = escalatedMail(mail, alertId)
    expect(escalation).toHaveLength(1)
    expect(escalation[0]!.envelopeTo).toEqual(['supervisor@tidewright.test'])
    expect(escalation[0]!.subject).toBe('Unanswered danger alert on Fernhill study reef')
    expect(escalation[0]!.text).toContain('has not been acknowledged for 60 minutes by Wren Castellanos')
    const notices = (await supervisor.get<NotificationList>('/api/notifications')).body
    expect(notices.items.some(n => n.kind === 'alert-escalated' && n.alertId === alertId)).toBe(true)
  })

  it('acknowledging stops the escalation', async () => {
    const client3 = await signedIn('client3@tidewright.test')
    const aquarist2 = await signedIn('aquarist2@tidewright.test')
    // The action-level alert; the EPA 4-day average, if open, stands until the average falls.
    const actionAlerts = async () => (await studyAlerts(aquarist2, 'active')).filter(a => a.kind === 'ammonia.action-threshold')
    await post(client3, CLEAR)
    expect(await actionAlerts()).toHaveLength(0)
    await post(client3, BAD)
    const [fresh] = await actionAlerts()
    expect(fresh!.id).not.toBe(alertId)

    expect((await client3.post(`/api/alerts/${fresh!.id}/acknowledge`, {})).status).toBe(403)
    expect((await (await signedIn(OTHER_AQUARIST_EMAIL)).post(`/api/alerts/${fresh!.id}/acknowledge`, {})).status).toBe(404)
    const acked = await aquarist2.post<AlertView>(`/api/alerts/${fresh!.id}/acknowledge`, { note: 'Calling the client; water change tonight.' })
    expect(acked.status).toBe(200)
    expect(acked.body).toMatchObject({ status: 'acknowledged', acknowledgedByName: 'Wren Castellanos', acknowledgeNote: 'Calling the client; water change tonight.' })
    expect((await aquarist2.post(`/api/alerts/${fresh!.id}/acknowledge`, {})).status).toBe(409)

    await tick(new Date(Date.parse(fresh!.openedAt) + 3 * 60 * MINUTE))
    expect((await studyAlerts(aquarist2)).find(a => a.id === fresh!.id)!.escalatedAt).toBeNull()
    expect(escalatedMail(await caughtMail(), fresh!.id)).toHaveLength(0)

    // By hand, resolving needs a reason.
    const noNote = await aquarist2.post(`/api/alerts/${fresh!.id}/resolve`, {})
    expect(noNote.status).toBe(400)
    expect(noNote.body.data.issues[0].field).toBe('note')
    const resolved = await aquarist2.post<AlertView>(`/api/alerts/${fresh!.id}/resolve`, { note: 'Water changed on site; re-test booked.' })
    expect(resolved.body).toMatchObject({ status: 'resolved', resolveNote: 'Water changed on site; re-test booked.' })
    expect((await aquarist2.post(`/api/alerts/${fresh!.id}/resolve`, { note: 'again' })).status).toBe(409)
  })
})

describe('test reminders', () => {
  it('reminds the client once a day after the usual test hour, then tells the aquarist after two missed days', async () => {
    // Days count from the day of the study reef's newest test, not from the clock: the demo's last
    // test is at its usual hour (08:00 UTC) on the day it was seeded, or the day before when seeded
    // earlier than that.
    const aquarist2 = await signedIn('aquarist2@tidewright.test')
    const newest = (await aquarist2.get<{ items: { takenAt: string }[] }>(`/api/tanks/${study}/readings?pageSize=1`)).body.items[0]!
    const lastDay = new Date(newest.takenAt)
    const at = (days: number, hour: number) => new Date(Date.UTC(lastDay.getUTCFullYear(), lastDay.getUTCMonth(), lastDay.getUTCDate() + days, hour))
    const reminders = (all: CaughtMail[]) => all.filter(m => m.envelopeTo.includes('client3@tidewright.test') && m.subject === 'Reminder: today\'s test for Fernhill study reef')
    const missed = (all: CaughtMail[]) => all.filter(m => m.envelopeTo.includes('aquarist2@tidewright.test') && /Fernhill study reef: \d+ days without a test/.test(m.subject))
    const before = reminders(await caughtMail()).length

    // Tomorrow 08:30 UTC: the study reef's usual hour is 8, with an hour's grace: not yet.
    await tick(at(1, 8))
    expect(reminders(await caughtMail())).toHaveLength(before)
    await tick(at(1, 10))
    await tick(at(1, 14))
    await waitForMail('first reminder', all => reminders(all).length === before + 1)
    expect(missed(await caughtMail())).toHaveLength(0)

    await tick(at(2, 10))
    await tick(at(2, 20))
    const mail = await waitForMail('second reminder and the aquarist told', all => reminders(all).length === before + 2 && missed(all).length === 1 && all)
    expect(missed(mail)[0]!.subject).toBe('Fernhill study reef: 2 days without a test')
    expect(reminders(mail).at(-1)!.text).toContain(`/tanks/${study}`)
  })
})

describe('notifications and preferences', () => {
  it('keeps each user\'s notices their own and marks them read', async () => {
    expect((await new ApiClient().get('/api/notifications')).status).toBe(401)
    const aquarist2 = await signedIn('aquarist2@tidewright.test')
    const mine = (await aquarist2.get<NotificationList>('/api/notifications')).body
    expect(mine.items.length).toBeGreaterThan(0)
    const first = mine.items.find(n => !n.readAt) ?? mine.items[0]!
    const other = await signedIn('aquarist@tidewright.test')
    expect((await other.post(`/api/notifications/${first.id}/read`)).status).toBe(404)
    const read = await aquarist2.post(`/api/notifications/${first.id}/read`)
    expect(read.status).toBe(200)
    expect(read.body.unread).toBe(mine.unread - (first.readAt ? 0 : 1))
    expect((await aquarist2.post('/api/notifications/read-all')).body.unread).toBe(0)
  })

  it('refuses unknown notice kinds and non-boolean choices with 400', async () => {
    const api = await signedIn('client3@tidewright.test')
    const bad = await api.request('PUT', '/api/me/notification-preferences', { emailKinds: { 'free-pizza': true } })
    expect(bad.status).toBe(400)
    const notBool = await api.request('PUT', '/api/me/notification-preferences', { emailKinds: { 'test-reminder': 'sometimes' } })
    expect(notBool.status).toBe(400)
    expect((await new ApiClient().request('PUT', '/api/me/notification-preferences', { emailKinds: {} })).status).toBe(401)
    const off = await api.request('PUT', '/api/me/notification-preferences', { emailKinds: { 'test-reminder': false } })
    expect(off.body.emailKinds).toEqual({ 'test-reminder': false })
    const items = (await api.get('/api/me/notification-preferences')).body.items
    expect(items.find((p: { kind: string }) => p.kind === 'test-reminder')).toMatchObject({ email: false, locked: false })
  })
})
