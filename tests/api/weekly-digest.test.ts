/**
 * The weekly e-mail to clients of cycling tanks, sent by the worker on Monday mornings
 * in the company's time zone, through a real mail catcher (POST /api/dev/worker-tick).
 * Moving the worker's clock to next Monday would run every clocked job of the shared
 * server (escalations, reminders) at that time, so this file has a server of its own.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { eq } from 'drizzle-orm'
import { startMailCatcher, type MailCatcher } from '../../scripts/mail-catcher'
import { openDatabase } from '../../server/db/connection'
import { organisations } from '../../server/db/schema'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { NITRITE_FALLING, seedCyclingTank } from '../support/forecast-tanks'
import { ApiClient } from '../support/http'
import { caughtMail, tick, waitForMail } from '../support/mail'
import { mailCatcherEnv } from '../support/mail-env'
import { startOwnServer, type OwnServer } from '../support/own-server'

const DAY = 86_400_000

/** 09:00 UTC on the first Monday at least a day from now. */
function nextMonday(): Date {
  const d = new Date(Date.now() + DAY)
  d.setUTCHours(9, 0, 0, 0)
  while (d.getUTCDay() !== 1) d.setTime(d.getTime() + DAY)
  return d
}

const monday = nextMonday()
let dir: string
let catcher: MailCatcher
let own: OwnServer
let company: ScratchCompany
let quiet: ScratchCompany

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'tidewright-digest-'))
  catcher = await startMailCatcher({ port: 0, file: join(dir, 'mail.jsonl') })
  own = await startOwnServer(mailCatcherEnv(catcher))
  company = await seedScratchCompany('digest', 'metric', own.dbPath)
  // Tests dated up to the Monday morning, as if the client kept testing all week.
  seedCyclingTank(company, 'Falling nitrite reef', NITRITE_FALLING, monday, own.dbPath)
  seedCyclingTank(company, 'Three tests reef', { ammonia: [1.6, 1.2, 0.6], nitrite: [0.3, 0.9, 1.2], nitrate: [0, 0, 0.1] }, monday, own.dbPath)
  quiet = await seedScratchCompany('digest-off', 'metric', own.dbPath)
  seedCyclingTank(quiet, 'Quiet reef', NITRITE_FALLING, monday, own.dbPath)
  const db = openDatabase(own.dbPath)
  try {
    db.update(organisations).set({ settings: { reminders: { enabled: false } } }).where(eq(organisations.id, quiet.organisationId)).run()
  }
  finally {
    db.$client.close()
  }
})

afterAll(async () => {
  await own?.cleanup()
  await catcher?.close()
  if (dir) rmSync(dir, { recursive: true, force: true })
})

const digestsTo = async (email: string) => (await caughtMail(own.server.baseURL)).filter(m => m.to.includes(email) && m.subject.startsWith('Your week ahead'))

describe('weekly digest e-mail', () => {
  it('is not sent before Monday morning', async () => {
    await tick(new Date(monday.getTime() - 2 * 3_600_000), own.server.baseURL)
    await tick(new Date(monday.getTime() - DAY), own.server.baseURL)
    expect(await digestsTo(company.emails.client)).toEqual([])
  })

  it('tells the client on Monday when each cycling tank is likely ready, as a forecast, not a promise', async () => {
    const result = await tick(monday, own.server.baseURL)
    expect(result.digests).toBeGreaterThanOrEqual(1)
    const mail = await waitForMail('weekly digest', all => all.find(m => m.to.includes(company.emails.client) && m.subject === 'Your week ahead: 2 tanks'), 20_000, own.server.baseURL)
    // The range as the card says it, on the company's clock: the year once when both ends share it.
    expect(mail.text).toMatch(/Falling nitrite reef: likely ready for fish between \w{3} \d{1,2}(, \d{4})? and \w{3} \d{1,2}, \d{4}\./)
    expect(mail.text).toContain('Nitrite has halved about every')
    expect(mail.text).toContain('Three tests reef: Not enough data yet: a forecast needs a few more tests')
    expect(mail.text).toContain('A forecast, not a promise: livestock goes in only when the verdict says the cycle is complete.')
    expect(mail.text).not.toMatch(/will be ready|guarantee/i)
    expect(mail.html).toContain('likely ready for fish between')
  })

  it('is sent once a week, and not to a company with reminders off or a client who switched it off', async () => {
    await tick(new Date(monday.getTime() + 2 * 3_600_000), own.server.baseURL)
    await tick(new Date(monday.getTime() + DAY), own.server.baseURL)
    expect(await digestsTo(company.emails.client)).toHaveLength(1)
    expect(await digestsTo(quiet.emails.client)).toEqual([])
    expect(await digestsTo(company.emails.otherClient)).toEqual([])

    const client = await new ApiClient(own.server.baseURL).signIn(company.emails.client)
    expect((await client.request('PUT', '/api/me/notification-preferences', { emailKinds: { 'weekly-digest': false } })).status).toBe(200)
    const following = new Date(monday.getTime() + 7 * DAY)
    await tick(following, own.server.baseURL)
    expect(await digestsTo(company.emails.client)).toHaveLength(1)
  })
})
