/**
 * Invitations and password resets by e-mail, through the real SMTP catcher: single-use,
 * expiring links, no account enumeration, password rules; and an SMTP outage that
 * loses nothing and sends nothing twice.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, inject, it } from 'vitest'
import { migrateDatabase, openDatabase } from '../../server/db/connection'
import { ApiClient, signedIn } from '../support/http'
import { OTHER_AQUARIST_EMAIL } from '../support/fixtures'
import { caughtMail, outbox, smtp, tick, tokenIn, waitForMail, waitForOutbox } from '../support/mail'
import { startServer } from '../support/server'

const { demo, other } = inject('fixtures')
const HOUR = 3_600_000
const NOW_HEADER = 'x-tidewright-test-now'

async function inviteLink(email: string): Promise<string> {
  const mail = await waitForMail(`invitation to ${email}`, all => all.find(m => m.envelopeTo.includes(email) && /invitation/i.test(m.subject)))
  return tokenIn(mail.text, '/accept-invite')
}

describe('POST /api/invitations', () => {
  it('lets an aquarist invite a client by e-mail, with a link that sets the password once', async () => {
    const aquarist = await signedIn('aquarist@tidewright.test')
    const email = 'quayle.partner@tidewright.test'
    const created = await aquarist.post('/api/invitations', { email, name: 'Sable Quayle', role: 'client', clientId: demo.clients.quayle })
    expect(created.status).toBe(201)
    expect(created.body.user).toMatchObject({ email, role: 'client' })

    const token = await inviteLink(email)
    const mail = (await caughtMail()).filter(m => m.envelopeTo.includes(email))
    expect(mail).toHaveLength(1)
    expect(mail[0]!.text).toContain('expires in 7 days')

    // An account without a password cannot sign in yet.
    expect((await new ApiClient().post('/api/auth/login', { email, password: 'anything-at-all' })).status).toBe(401)

    const info = await new ApiClient().get(`/api/auth/token?token=${token}`)
    expect(info.status).toBe(200)
    expect(info.body).toEqual({ purpose: 'invite', email, name: 'Sable Quayle' })

    const visitor = new ApiClient()
    const asEmail = await visitor.post('/api/auth/accept-invite', { token, password: email })
    expect(asEmail.status).toBe(400)
    expect(asEmail.body.data.issues[0].field).toBe('password')
    const tooShort = await visitor.post('/api/auth/accept-invite', { token, password: 'short' })
    expect(tooShort.status).toBe(400)
    expect(JSON.stringify(tooShort.body)).not.toContain('short"')

    const accepted = await visitor.post('/api/auth/accept-invite', { token, password: 'coral-sand-ladder-42' })
    expect(accepted.status).toBe(200)
    expect(accepted.body.user.role).toBe('client')
    const me = await visitor.get('/api/me')
    expect(me.status).toBe(200)

    // Single use: the same link is refused afterwards.
    expect((await new ApiClient().post('/api/auth/accept-invite', { token, password: 'another-password-99' })).status).toBe(410)
    expect((await new ApiClient().get(`/api/auth/token?token=${token}`)).status).toBe(404)
    await new ApiClient().signIn(email, 'coral-sand-ladder-42')
  })

  it('expires an invitation link after 7 days (test clock)', async () => {
    const admin = await signedIn('admin@tidewright.test')
    const email = 'late.starter@tidewright.test'
    expect((await admin.post('/api/invitations', { email, name: 'Rowan Tillery', role: 'aquarist' })).status).toBe(201)
    const token = await inviteLink(email)
    const later = new Date(Date.now() + 7 * 24 * HOUR + HOUR).toISOString()
    const expired = await new ApiClient().request('POST', '/api/auth/accept-invite', { token, password: 'tidepool-lantern-7' }, { [NOW_HEADER]: later })
    expect(expired.status).toBe(410)
    // Still good on the real clock: expiry, not a broken token, refused it.
    expect((await new ApiClient().post('/api/auth/accept-invite', { token, password: 'tidepool-lantern-7' })).status).toBe(200)
  })

  it('lets only the admin invite staff, and keeps to the inviter\'s company', async () => {
    const aquarist = await signedIn('aquarist@tidewright.test')
    expect((await aquarist.post('/api/invitations', { email: 'new.staff@tidewright.test', name: 'Ada Vell', role: 'aquarist' })).status).toBe(403)
    const supervisor = await signedIn('supervisor@tidewright.test')
    expect((await supervisor.post('/api/invitations', { email: 'new.client@tidewright.test', name: 'Ada Vell', role: 'client', clientId: demo.clients.hart })).status).toBe(403)
    const client = await signedIn('client@tidewright.test')
    expect((await client.post('/api/invitations', { email: 'friend@tidewright.test', name: 'Ada Vell', role: 'client', clientId: demo.clients.lowe })).status).toBe(403)
    expect((await new ApiClient().post('/api/invitations', { email: 'x@tidewright.test', name: 'X', role: 'client', clientId: demo.clients.lowe })).status).toBe(401)
    // Another company's client record is not found.
    const theirs = await signedIn(OTHER_AQUARIST_EMAIL)
    expect((await theirs.post('/api/invitations', { email: 'poacher@other-company.test', name: 'P', role: 'client', clientId: demo.clients.lowe })).status).toBe(404)
    expect(other.organisationId).not.toBe(demo.organisationId)
  })

  it('refuses bad input with field messages', async () => {
    const admin = await signedIn('admin@tidewright.test')
    const bad = await admin.post('/api/invitations', { email: 'not-an-address', name: '', role: 'wizard' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues.map((i: { field: string }) => i.field)).toEqual(expect.arrayContaining(['email', 'name', 'role']))
    const clientWithout = await admin.post('/api/invitations', { email: 'c@tidewright.test', name: 'C', role: 'client' })
    expect(clientWithout.status).toBe(400)
    expect(clientWithout.body.data.issues[0].field).toBe('clientId')
  })

  it('answers an invitation to an address that already has an account (here or elsewhere) like any other, and tells its owner by mail', async () => {
    const admin = await signedIn('admin@tidewright.test')
    const fresh = await admin.post('/api/invitations', { email: 'brand.new.person@tidewright.test', name: 'Dup', role: 'client', clientId: demo.clients.lowe })
    const here = await admin.post('/api/invitations', { email: 'client@tidewright.test', name: 'Dup', role: 'client', clientId: demo.clients.lowe })
    const elsewhere = await admin.post('/api/invitations', { email: OTHER_AQUARIST_EMAIL, name: 'Dup', role: 'client', clientId: demo.clients.lowe })
    for (const answer of [here, elsewhere]) {
      expect(answer.status).toBe(fresh.status)
      expect(Object.keys(answer.body.user).sort()).toEqual(Object.keys(fresh.body.user).sort())
    }
    expect(elsewhere.body.user).toEqual({ email: OTHER_AQUARIST_EMAIL, name: 'Dup', role: 'client' })
    const told = await waitForMail('already-has-an-account mail', all => all.find(m => m.envelopeTo.includes(OTHER_AQUARIST_EMAIL) && /already have/i.test(m.subject)))
    expect(told.text).toContain('no new account was made')
    expect(told.text).not.toMatch(/accept-invite/)
  })
})

describe('password reset', () => {
  const email = 'reset.me@tidewright.test'

  async function resetLink(): Promise<string> {
    const before = (await caughtMail()).filter(m => m.envelopeTo.includes(email) && /reset/i.test(m.subject)).length
    const answer = await new ApiClient().post('/api/auth/forgot-password', { email })
    expect(answer.status).toBe(200)
    const mail = await waitForMail('reset e-mail', (all) => {
      const resets = all.filter(m => m.envelopeTo.includes(email) && /reset/i.test(m.subject))
      return resets.length > before && resets.at(-1)
    })
    return tokenIn(mail.text, '/reset-password')
  }

  it('answers the same whether or not the address has an account, and mails only real accounts', async () => {
    const admin = await signedIn('admin@tidewright.test')
    expect((await admin.post('/api/invitations', { email, name: 'Lark Denholm', role: 'supervisor' })).status).toBe(201)
    const invite = await inviteLink(email)
    expect((await new ApiClient().post('/api/auth/accept-invite', { token: invite, password: 'first-password-123' })).status).toBe(200)

    const known = await new ApiClient().post('/api/auth/forgot-password', { email })
    const unknown = await new ApiClient().post('/api/auth/forgot-password', { email: 'nobody.here@tidewright.test' })
    expect(unknown.status).toBe(known.status)
    expect(unknown.body).toEqual(known.body)
    await waitForMail('reset for the known address', all => all.some(m => m.envelopeTo.includes(email) && /reset/i.test(m.subject)))
    // Every queued message is delivered by now or soon; none is for the unknown address.
    const rows = await outbox()
    expect(rows.some(r => r.toAddress === 'nobody.here@tidewright.test')).toBe(false)
  })

  it('sets a new password once; the old password and the used link stop working', async () => {
    const token = await resetLink()
    const visitor = new ApiClient()
    expect((await visitor.post('/api/auth/reset-password', { token, password: 'Reset.Me@tidewright.test' })).status).toBe(400)
    // An invite route does not accept a reset link.
    expect((await new ApiClient().post('/api/auth/accept-invite', { token, password: 'second-password-456' })).status).toBe(410)
    expect((await visitor.post('/api/auth/reset-password', { token, password: 'second-password-456' })).status).toBe(200)
    expect((await new ApiClient().post('/api/auth/reset-password', { token, password: 'third-password-789' })).status).toBe(410)
    expect((await new ApiClient().post('/api/auth/login', { email, password: 'first-password-123' })).status).toBe(401)
    await new ApiClient().signIn(email, 'second-password-456')
  })

  it('expires a reset link after an hour, and a newer link retires the older one', async () => {
    const first = await resetLink()
    const second = await resetLink()
    expect((await new ApiClient().post('/api/auth/reset-password', { token: first, password: 'never-used-password' })).status).toBe(410)
    const later = new Date(Date.now() + HOUR + 60_000).toISOString()
    expect((await new ApiClient().request('POST', '/api/auth/reset-password', { token: second, password: 'too-late-password' }, { [NOW_HEADER]: later })).status).toBe(410)
    expect((await new ApiClient().post('/api/auth/reset-password', { token: second, password: 'in-time-password' })).status).toBe(200)
  })

  it('refuses a malformed token with 400', async () => {
    const response = await new ApiClient().post('/api/auth/reset-password', { token: 'abc', password: 'long-enough-password' })
    expect(response.status).toBe(400)
  })
})

describe('mail delivery through an SMTP outage', () => {
  it('keeps the message while the mail server is down and delivers it exactly once after', async () => {
    const admin = await signedIn('admin@tidewright.test')
    const email = 'outage.test@tidewright.test'
    await smtp('stop')
    try {
      expect((await admin.post('/api/invitations', { email, name: 'Perrin Oake', role: 'aquarist' })).status).toBe(201)
      const failed = await waitForOutbox('a failed attempt', rows => rows.find(r => r.toAddress === email && r.attempts >= 1 && r.status === 'pending' && r.lastError))
      expect(failed.lastError).toBeTruthy()
      // More rounds while it is down: still nothing delivered, still queued.
      await tick(new Date(Date.now() + 2 * HOUR))
      expect((await caughtMail()).filter(m => m.envelopeTo.includes(email))).toHaveLength(0)
    }
    finally {
      await smtp('start')
    }
    const row = (await outbox()).find(r => r.toAddress === email)!
    await tick(new Date(Date.now() + 4 * HOUR))
    await waitForOutbox('delivery after recovery', rows => rows.find(r => r.toAddress === email && r.status === 'sent'))
    await tick(new Date(Date.now() + 8 * HOUR))
    const caught = (await caughtMail()).filter(m => m.envelopeTo.includes(email))
    expect(caught).toHaveLength(1)
    expect(caught[0]!.messageId).toBe(row.messageId)
  })
})

describe('dev and test routes', () => {
  it('GET /api/dev/mail is for the admin only', async () => {
    expect((await new ApiClient().get('/api/dev/mail')).status).toBe(401)
    expect((await (await signedIn('aquarist@tidewright.test')).get('/api/dev/mail')).status).toBe(403)
  })

  it('are 404 on a server started without NUXT_DEV_MAIL and NUXT_TEST_HOOKS', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tidewright-prod-'))
    const dbPath = join(dir, 'prod.sqlite')
    const db = openDatabase(dbPath)
    migrateDatabase(db)
    db.$client.close()
    const server = await startServer({ dbPath })
    try {
      for (const [method, path] of [['GET', '/api/dev/mail'], ['GET', '/api/dev/outbox'], ['POST', '/api/dev/worker-tick']] as const) {
        const response = await fetch(`${server.baseURL}${path}`, { method, headers: { 'content-type': 'application/json' }, body: method === 'POST' ? '{}' : undefined })
        expect(response.status, path).toBe(404)
      }
    }
    finally {
      await server.stop()
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
