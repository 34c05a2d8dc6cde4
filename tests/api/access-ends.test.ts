/**
 * Access that must end: a client whose client record is archived loses access at once
 * (restoring the record brings it back), and the person who asked for a sign-off does not
 * approve it themself unless the company allows it and a reason is written.
 */
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { organisations } from '../../server/db/schema'
import { seedScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'
import { PASSWORD } from '../support/fixtures'
import { copyTank } from '../support/sign-off-tanks'

let db: TidewrightDB
beforeAll(() => {
  db = openDatabase(inject('dbPath'))
})
afterAll(() => db?.$client.close())

describe('archiving a client', () => {
  it('ends its accounts\' access at once; restoring the record brings it back', async () => {
    const company = await seedScratchCompany('archive-access')
    const client = await new ApiClient().signIn(company.emails.client)
    const stolen = client.copy()
    expect((await client.get('/api/tanks')).status).toBe(200)
    const aquarist = await new ApiClient().signIn(company.emails.aquarist)
    expect((await aquarist.post(`/api/clients/${company.clientId}/archive`, { archived: true })).status).toBe(200)
    expect((await client.get('/api/tanks')).status).toBe(401)
    expect((await stolen.get('/api/me')).status).toBe(401)
    expect((await new ApiClient().post('/api/auth/login', { email: company.emails.client, password: PASSWORD })).status).toBe(401)
    // Another client of the company is not touched.
    expect((await new ApiClient().post('/api/auth/login', { email: company.emails.otherClient, password: PASSWORD })).status).toBe(200)
    expect((await aquarist.post(`/api/clients/${company.clientId}/archive`, { archived: false })).status).toBe(200)
    expect((await new ApiClient().post('/api/auth/login', { email: company.emails.client, password: PASSWORD })).status).toBe(200)
  })
})

describe('approving one\'s own sign-off request', () => {
  it('is refused unless the company allows it, and then needs a written reason', async () => {
    const company = await seedScratchCompany('self-approval')
    const tankId = copyTank(db, inject('fixtures').demo.tanks.nano, 'Self-approval reef', {
      organisationId: company.organisationId, clientId: company.clientId, siteId: company.siteId,
      aquaristId: company.ids.aquarist, supervisorId: company.ids.supervisor,
    })
    const admin = await new ApiClient().signIn(company.emails.admin)
    expect((await admin.post(`/api/tanks/${tankId}/sign-off-requests`, { note: 'Ready' })).status).toBe(201)
    const own = await admin.post(`/api/tanks/${tankId}/sign-off/decision`, { decision: 'approve', note: 'Looks fine' })
    expect(own.status).toBe(403)
    db.update(organisations).set({ settings: { signOff: { requesterMayApprove: true } } }).where(eq(organisations.id, company.organisationId)).run()
    const noReason = await admin.post(`/api/tanks/${tankId}/sign-off/decision`, { decision: 'approve' })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.issues[0].field).toBe('note')
    expect((await admin.post(`/api/tanks/${tankId}/sign-off/decision`, { decision: 'approve', note: 'Only supervisor is on leave; evidence reviewed' })).status).toBe(200)
  })

  it('lets another supervisor or admin approve as before', async () => {
    const company = await seedScratchCompany('four-eyes')
    const tankId = copyTank(db, inject('fixtures').demo.tanks.nano, 'Four eyes reef', {
      organisationId: company.organisationId, clientId: company.clientId, siteId: company.siteId,
      aquaristId: company.ids.aquarist, supervisorId: company.ids.supervisor,
    })
    expect((await (await new ApiClient().signIn(company.emails.admin)).post(`/api/tanks/${tankId}/sign-off-requests`, {})).status).toBe(201)
    expect((await (await new ApiClient().signIn(company.emails.supervisor)).post(`/api/tanks/${tankId}/sign-off/decision`, { decision: 'approve' })).status).toBe(200)
  })
})
