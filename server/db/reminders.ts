/**
 * Test reminders. A client whose cycling tank has no test yet today, once the tank's usual
 * test hour (plus a grace) has passed in the company's time zone, gets one reminder a day;
 * after the company's number of missed days the assigned aquarist is told, once per gap.
 * Framework-free and driven by an explicit `now`, so the worker and the tests share it.
 */
import { and, desc, eq, isNotNull, isNull } from 'drizzle-orm'
import type { Db } from './connection'
import { plainHtml } from '../domain/alerts/mail'
import { writeNotice } from './notices'
import { organisations, readings, tanks, users } from './schema'
import { readOrganisationSettings } from './settings'

/** Local calendar date (YYYY-MM-DD) and minutes past midnight of an instant in a time zone. */
export function localClock(at: Date, timeZone: string): { date: string, minutes: number } {
  let parts: Intl.DateTimeFormatPart[]
  try {
    parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).formatToParts(at)
  }
  catch {
    return localClock(at, 'UTC')
  }
  const get = (type: string) => parts.find(p => p.type === type)?.value ?? '00'
  return { date: `${get('year')}-${get('month')}-${get('day')}`, minutes: Number(get('hour')) * 60 + Number(get('minute')) }
}

function daysBetween(fromDate: string, toDate: string): number {
  return Math.round((Date.parse(`${toDate}T00:00:00Z`) - Date.parse(`${fromDate}T00:00:00Z`)) / 86_400_000)
}

export interface ReminderRunResult {
  reminded: { tankId: string, userId: string }[]
  aquaristsTold: { tankId: string, userId: string, missedDays: number }[]
  notifiedUserIds: string[]
}

/** Sends the reminders and missed-test notices due at `now`. Idempotent: a second run the same day adds nothing. */
export function runTestReminders(db: Db, now: Date, baseUrl: string): ReminderRunResult {
  const out: ReminderRunResult = { reminded: [], aquaristsTold: [], notifiedUserIds: [] }
  const base = baseUrl.replace(/\/+$/, '')
  for (const org of db.select().from(organisations).all()) {
    const { reminders: settings, timeZone } = readOrganisationSettings(db, org.id)
    if (!settings.enabled) continue
    const today = localClock(now, timeZone)
    const due = db.select().from(tanks).where(and(
      eq(tanks.organisationId, org.id), eq(tanks.status, 'cycling'), isNull(tanks.archivedAt), isNotNull(tanks.usualTestHour),
    )).all()
    for (const tank of due) {
      const hour = tank.usualTestHour ?? 0
      const pastDue = today.minutes >= hour * 60 + settings.graceMinutes
      const latest = db.select({ id: readings.id, takenAt: readings.takenAt }).from(readings)
        .where(eq(readings.tankId, tank.id)).orderBy(desc(readings.takenAt)).limit(1).get()
      const lastDate = localClock(new Date(latest?.takenAt ?? tank.cycleStartedAt ?? tank.createdAt), timeZone).date
      if (lastDate >= today.date) continue
      const url = `${base}/tanks/${tank.id}`
      db.transaction((t) => {
        if (pastDue) {
          const clientsOfTank = t.select().from(users).where(and(eq(users.clientId, tank.clientId), eq(users.role, 'client'), eq(users.active, true))).all()
          for (const client of clientsOfTank) {
            const body = `Today's water test for ${tank.name} has not been entered yet. Test ammonia, nitrite, pH and temperature and enter them in Tidewright.`
            const notice = writeNotice(t, {
              id: `reminder:${tank.id}:${client.id}:${today.date}`,
              userId: client.id, organisationId: org.id, kind: 'test-reminder', title: `Test due: ${tank.name}`, body, link: `/tanks/${tank.id}`,
              email: { subject: `Reminder: today's test for ${tank.name}`, text: `${body}\n\n${url}`, html: plainHtml([body], { href: url, label: `Enter today's test` }), messageId: `<reminder-${tank.id}-${client.id}-${today.date}@mail.tidewright.invalid>` },
            }, now)
            if (notice.created) {
              out.reminded.push({ tankId: tank.id, userId: client.id })
              out.notifiedUserIds.push(client.id)
            }
          }
        }
        // Days without a test: the whole days since the last one, and today once it is past due.
        const missed = daysBetween(lastDate, today.date) - (pastDue ? 0 : 1)
        const aquarist = tank.aquaristId ? t.select().from(users).where(eq(users.id, tank.aquaristId)).get() : undefined
        if (missed >= settings.missedDays && aquarist?.active) {
          const body = `No water test has been entered for ${tank.name} for ${missed} days. A call to the client may help.`
          const gap = latest?.id ?? 'none'
          const notice = writeNotice(t, {
            id: `missed:${tank.id}:${gap}`,
            userId: aquarist.id, organisationId: org.id, kind: 'tests-missed', title: `Tests missed: ${tank.name}`, body, link: `/tanks/${tank.id}`,
            email: { subject: `${tank.name}: ${missed} days without a test`, text: `${body}\n\n${url}`, html: plainHtml([body], { href: url, label: `Open ${tank.name}` }), messageId: `<missed-${tank.id}-${gap}@mail.tidewright.invalid>` },
          }, now)
          if (notice.created) {
            out.aquaristsTold.push({ tankId: tank.id, userId: aquarist.id, missedDays: missed })
            out.notifiedUserIds.push(aquarist.id)
          }
        }
      })
    }
  }
  return out
}
