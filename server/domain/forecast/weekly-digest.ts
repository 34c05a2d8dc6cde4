/**
 * The weekly e-mail to each client whose tank is cycling: for every such tank, when it
 * is likely to be ready (the completion forecast) or why there is no date yet, said as
 * a forecast and never as a promise. Sent on Monday mornings in the company's time
 * zone while the company's reminders are on; a client can switch it off among their
 * e-mail choices. E-mail only (it repeats what the tank page shows, so it adds no
 * notice to the app). Framework-free with an explicit `now`, like the test reminders.
 *
 * Each tank's words come from the forecast stored with its verdict, the one its page shows:
 * the clocked jobs make stale verdicts again first (a long history's in the worker pool), so
 * the digest never runs the engine on the request loop. A client one of whose tanks has no
 * stored forecast yet gets the digest on a later run that Monday rather than a made-up line.
 */
import { and, eq, inArray, isNull } from 'drizzle-orm'
import { explainForecast, FORECAST_CAVEAT, forecastGapWords, forecastRangeWords } from '#shared/cycle/forecast'
import type { CycleForecast, DateWords } from '#shared/cycle/forecast'
import { formatDay } from '#shared/readings/reader-words'
import { wantsEmail } from '#shared/notifications/kinds'
import type { CycleMethod } from '#shared/vocabulary'
import { plainHtml } from '#server/domain/alerts/mail'
import type { Db } from '#server/db/connection'
import { emailChoices } from '#server/db/notices'
import { enqueueMail, MESSAGE_ID_DOMAIN } from '#server/db/outbox'
import { localClock } from '#server/db/reminders'
import { mailOutbox, organisations, tanks, users } from '#server/db/schema'
import { readOrganisationSettings } from '#server/db/settings'
import { storedForecasts } from '#server/db/verdicts'
import { FORECAST_STATUSES } from './tank-forecast'

/** Monday (0 is Sunday), from 08:00 local time: the start of the client's week. */
export const DIGEST_WEEKDAY = 1
export const DIGEST_FROM_MINUTES = 8 * 60

/** A day on the company's clock, "Dec 18, 2026" (UTC when the stored zone is not one the runtime knows). */
function dateIn(timeZone: string): DateWords {
  let zone = timeZone
  try {
    formatDay(0, zone)
  }
  catch {
    zone = 'UTC'
  }
  return iso => formatDay(Date.parse(iso), zone)
}

/** The paragraph about one tank. */
export function tankDigestWords(name: string, cycleMethod: CycleMethod, forecast: CycleForecast, date: DateWords): string {
  if (forecast.status === 'complete') return `${name}: the verdict proved the cycle complete on ${date(forecast.completion!.from)}. Your aquarist will confirm what may go in and when.`
  if (forecast.status === 'not-enough-data' || !forecast.groups.fish) return `${name}: ${forecastGapWords(forecast.gap ?? 'sparse')}`
  const fish = cycleMethod === 'fish-in' ? 'more fish' : 'fish'
  return `${name}: likely ready for ${fish} ${forecastRangeWords(forecast.groups.fish, date)}. ${explainForecast(forecast, date)}`
}

export interface DigestRunResult {
  sent: { userId: string, tankIds: string[] }[]
}

interface DigestTank { id: string, name: string, cycleMethod: CycleMethod, clientId: string }

/** Queues the weekly digests due at `now` from the stored forecasts (make stale verdicts again first). Idempotent: one per client and local Monday. */
export function runWeeklyDigest(db: Db, now: Date, baseUrl: string): DigestRunResult {
  const out: DigestRunResult = { sent: [] }
  const base = baseUrl.replace(/\/+$/, '')
  for (const org of db.select().from(organisations).all()) {
    const { reminders, timeZone } = readOrganisationSettings(db, org.id)
    if (!reminders.enabled) continue
    const local = localClock(now, timeZone)
    if (new Date(`${local.date}T00:00:00Z`).getUTCDay() !== DIGEST_WEEKDAY || local.minutes < DIGEST_FROM_MINUTES) continue
    const cycling: DigestTank[] = db.select({ id: tanks.id, name: tanks.name, cycleMethod: tanks.cycleMethod, clientId: tanks.clientId }).from(tanks)
      .where(and(eq(tanks.organisationId, org.id), inArray(tanks.status, [...FORECAST_STATUSES]), isNull(tanks.archivedAt)))
      .orderBy(tanks.name).all()
    if (!cycling.length) continue
    const date = dateIn(timeZone)
    const forecasts = storedForecasts(db, cycling.map(t => t.id))
    const byClient = new Map<string, DigestTank[]>()
    for (const t of cycling) byClient.set(t.clientId, [...(byClient.get(t.clientId) ?? []), t])
    for (const [clientId, clientTanks] of byClient) {
      const recipients = db.select().from(users).where(and(eq(users.clientId, clientId), eq(users.role, 'client'), eq(users.active, true))).all()
      const digestId = (userId: string) => `<digest-${userId}-${local.date}@${MESSAGE_ID_DOMAIN}>`
      // One per client and local Monday: the Message-ID is the key, so later runs that day add nothing.
      const due = recipients.filter(u => wantsEmail(emailChoices(db, u.id), 'weekly-digest')
        && !db.select({ id: mailOutbox.id }).from(mailOutbox).where(eq(mailOutbox.messageId, digestId(u.id))).get())
      if (!due.length) continue
      const stored = clientTanks.map(t => forecasts.get(t.id))
      if (stored.some(forecast => !forecast)) continue
      const paragraphs = clientTanks.map((t, i) => tankDigestWords(t.name, t.cycleMethod, stored[i]!, date))
      paragraphs.push(FORECAST_CAVEAT)
      const links = clientTanks.map(t => `${t.name}: ${base}/tanks/${t.id}`)
      for (const user of due) {
        enqueueMail(db, {
          organisationId: org.id,
          to: user.email,
          subject: `Your week ahead: ${clientTanks.length === 1 ? clientTanks[0]!.name : `${clientTanks.length} tanks`}`,
          text: [...paragraphs, ...links].join('\n\n'),
          html: plainHtml(paragraphs, { href: `${base}/`, label: 'Open Tidewright' }),
          kind: 'weekly-digest',
          messageId: digestId(user.id),
        }, now)
        out.sent.push({ userId: user.id, tankIds: clientTanks.map(t => t.id) })
      }
    }
  }
  return out
}
