/**
 * The weekly digest says of each tank what the tank's page says: the forecast stored with its
 * verdict, not one computed again on the request loop (which, for a tank of years of tests, held
 * every other company's requests). A client one of whose tanks has no stored forecast yet waits
 * for a later run rather than getting a line made up.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { and, eq, inArray, isNull } from 'drizzle-orm'
import { afterAll, describe, expect, it } from 'vitest'
import { forecastGapWords, type CycleForecast, type ForecastGap } from '../../../../shared/cycle/forecast'
import { migrateDatabase, openDatabase } from '../../../../server/db/connection'
import { mailOutbox, tanks, tankVerdicts } from '../../../../server/db/schema'
import { seedDemo } from '../../../../server/db/seed/demo'
import { evaluateTankNow, storeVerdict } from '../../../../server/db/verdicts'
import { FORECAST_STATUSES } from '../../../../server/domain/forecast/tank-forecast'
import { runWeeklyDigest } from '../../../../server/domain/forecast/weekly-digest'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-digest-unit-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

/** 18:00 UTC on the next Monday: Monday after 08:00 on the demo company's clock (UTC). */
function nextMonday(): Date {
  const d = new Date(Date.now() + 86_400_000)
  d.setUTCHours(18, 0, 0, 0)
  while (d.getUTCDay() !== 1) d.setTime(d.getTime() + 86_400_000)
  return d
}

/** A gap the engine did not give: stored in its place, it shows which forecast the digest read. */
const otherGap = (gap: ForecastGap | null): ForecastGap => gap === 'erratic' ? 'stale' : 'erratic'

async function demoOnMonday(name: string) {
  const db = openDatabase(join(dir, `${name}.sqlite`))
  migrateDatabase(db)
  const monday = nextMonday()
  const ids = await seedDemo(db, monday)
  const cycling = db.select({ id: tanks.id, name: tanks.name, clientId: tanks.clientId }).from(tanks)
    .where(and(eq(tanks.organisationId, ids.organisationId), inArray(tanks.status, [...FORECAST_STATUSES]), isNull(tanks.archivedAt))).all()
  return { db, monday, cycling }
}

describe('the weekly digest', () => {
  it('says of each tank what the forecast stored with its verdict says', async () => {
    const { db, monday, cycling } = await demoOnMonday('stored')
    expect(cycling.length).toBeGreaterThan(0)
    const shown = new Map<string, CycleForecast>()
    for (const tank of cycling) {
      const evaluation = evaluateTankNow(db, tank.id, monday)!
      const forecast: CycleForecast = { ...evaluation.forecast, status: 'not-enough-data', gap: otherGap(evaluation.forecast.gap) }
      storeVerdict(db, tank.id, { verdict: evaluation.verdict, forecast }, monday.toISOString())
      shown.set(tank.id, forecast)
    }

    const result = runWeeklyDigest(db, monday, 'https://tidewright.example')
    expect(result.sent.length).toBeGreaterThan(0)
    const mail = db.select().from(mailOutbox).where(eq(mailOutbox.kind, 'weekly-digest')).all()
    expect(mail.length).toBe(result.sent.length)
    for (const sent of result.sent) {
      for (const tankId of sent.tankIds) {
        const tank = cycling.find(t => t.id === tankId)!
        const text = mail.map(m => m.textBody).join('\n')
        expect(text).toContain(`${tank.name}: ${forecastGapWords(shown.get(tankId)!.gap!)}`)
      }
    }
  })

  it('waits for a tank without a stored forecast, then sends once it is stored', async () => {
    const { db, monday, cycling } = await demoOnMonday('missing')
    for (const tank of cycling) {
      const evaluation = evaluateTankNow(db, tank.id, monday)!
      storeVerdict(db, tank.id, evaluation, monday.toISOString())
    }
    const [waiting] = cycling
    db.delete(tankVerdicts).where(eq(tankVerdicts.tankId, waiting!.id)).run()

    const first = runWeeklyDigest(db, monday, 'https://tidewright.example')
    expect(first.sent.flatMap(s => s.tankIds)).not.toContain(waiting!.id)

    storeVerdict(db, waiting!.id, evaluateTankNow(db, waiting!.id, monday)!, monday.toISOString())
    const later = runWeeklyDigest(db, new Date(monday.getTime() + 60_000), 'https://tidewright.example')
    expect(later.sent.flatMap(s => s.tankIds)).toContain(waiting!.id)
  })
})
