/**
 * Throttles that hold when requests arrive together: sign-in attempts are reserved before
 * the password is checked, password-reset and invitation mail (resends included) are
 * limited per address with the same answer either way, invitations per inviting account,
 * and an IPv6 network is counted by its /64 behind a trusted proxy. A server of its own, so the attempts counted
 * here (all from 127.0.0.1) never slow other test files.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { LOCKOUT_EMAIL, PASSWORD } from '../support/fixtures'
import { startOwnServer, type OwnServer } from '../support/own-server'

let own: OwnServer
beforeAll(async () => {
  own = await startOwnServer()
})
afterAll(async () => {
  await own?.cleanup()
})

const resetMailsTo = (email: string) => queryFile<{ n: number }>(own.dbPath, `select count(*) as n from mail_outbox where to_address = ? and kind = 'reset'`, email)[0]!.n

describe('sign-in under concurrency', () => {
  it('checks at most the account limit (8) of 60 wrong passwords sent at once; the rest are refused unchecked', async () => {
    const guesses = await Promise.all(Array.from({ length: 60 }, (_, i) =>
      new ApiClient(own.server.baseURL).post('/api/auth/login', { email: LOCKOUT_EMAIL, password: `parallel-guess-${i}` })))
    const statuses = guesses.map(g => g.status)
    const checked = statuses.filter(s => s === 401).length
    console.log(`[throttle] 60 parallel wrong passwords: ${checked} checked (401), ${statuses.filter(s => s === 429).length} refused (429)`)
    expect(checked).toBeLessThanOrEqual(8)
    expect(checked + statuses.filter(s => s === 429).length).toBe(60)
    // Locked now, even with the right password.
    expect((await new ApiClient(own.server.baseURL).post('/api/auth/login', { email: LOCKOUT_EMAIL, password: PASSWORD })).status).toBe(429)
  })

  it('gives a successful sign-in\'s attempt back: many sign-ins from one network (an office) go on working', async () => {
    // The network limit is 30 in 15 minutes and 8 failures are on record from above.
    for (let i = 0; i < 30; i++) {
      expect((await new ApiClient(own.server.baseURL).post('/api/auth/login', { email: 'client3@tidewright.test', password: PASSWORD })).status).toBe(200)
    }
  })
})

describe('password-reset mail', () => {
  it('sends at most 3 mails an hour to one address from 30 requests at once, answering every request the same', async () => {
    const email = 'client2@tidewright.test'
    const before = resetMailsTo(email)
    const answers = await Promise.all(Array.from({ length: 30 }, () => new ApiClient(own.server.baseURL).post('/api/auth/forgot-password', { email })))
    const sent = resetMailsTo(email) - before
    console.log(`[throttle] 30 parallel forgot-password requests for one address: ${sent} mails queued`)
    expect(sent).toBeGreaterThan(0)
    expect(sent).toBeLessThanOrEqual(3)
    for (const answer of answers) {
      expect(answer.status).toBe(200)
      expect(answer.body).toEqual(answers[0]!.body)
    }
  })

  it('limits one network to 20 reset requests an hour, whatever the addresses, with the same answer', async () => {
    const unknown = await Promise.all(Array.from({ length: 20 }, (_, i) => new ApiClient(own.server.baseURL).post('/api/auth/forgot-password', { email: `nobody-${i}@example.test` })))
    const email = 'supervisor@tidewright.test'
    const before = resetMailsTo(email)
    const known = await new ApiClient(own.server.baseURL).post('/api/auth/forgot-password', { email })
    expect(known.status).toBe(200)
    expect(known.body).toEqual(unknown[0]!.body)
    expect(resetMailsTo(email)).toBe(before)
  })
})

const inviteMailsTo = (email: string) => queryFile<{ n: number }>(own.dbPath, `select count(*) as n from mail_outbox where to_address = ? and kind = 'invite'`, email)[0]!.n

async function invitee(admin: ApiClient, email: string): Promise<string> {
  const invited = await admin.post('/api/invitations', { email, name: 'Throttle Invitee', role: 'client', clientId: own.fixtures.demo.clients.lowe })
  expect(invited.status).toBe(201)
  return queryFile<{ id: string }>(own.dbPath, 'select id from users where email = ?', email)[0]!.id
}

describe('invitation mail', () => {
  it('sends at most 3 invitation mails a day to one address from an invitation and 20 resends at once, answering every resend the same', async () => {
    const admin = await new ApiClient(own.server.baseURL).signIn('admin@tidewright.test')
    const email = 'resend.flood@tidewright.test'
    const id = await invitee(admin, email)
    const answers = await Promise.all(Array.from({ length: 20 }, () => admin.post(`/api/invitations/${id}/resend`)))
    const sent = inviteMailsTo(email)
    console.log(`[throttle] an invitation and 20 parallel resends to one address: ${sent} mails queued`)
    expect(sent).toBeGreaterThan(0)
    expect(sent).toBeLessThanOrEqual(3)
    for (const answer of answers) {
      expect(answer.status).toBe(200)
      expect(answer.body.sentTo).toBe(email)
    }
  })

  it('limits one inviting account to 30 invitation mails an hour, resends included (429 past it)', async () => {
    const admin = await new ApiClient(own.server.baseURL).signIn('admin@tidewright.test')
    const id = await invitee(admin, 'resend.account@tidewright.test')
    const answers = await Promise.all(Array.from({ length: 30 }, () => admin.post(`/api/invitations/${id}/resend`)))
    const refused = answers.filter(a => a.status === 429)
    console.log(`[throttle] 30 more parallel resends by one account (22 invitations and resends before): ${refused.length} refused (429)`)
    expect(refused.length).toBeGreaterThanOrEqual(30 - 8)
    expect(refused[0]!.headers.get('retry-after')).toBeTruthy()
    const another = await admin.post('/api/invitations', { email: 'one.more@tidewright.test', name: 'One More', role: 'client', clientId: own.fixtures.demo.clients.lowe })
    expect(another.status).toBe(429)
  })
})

describe('addresses a client claims', () => {
  it('counts failures under the socket\'s address, whatever X-Forwarded-For says (no trusted proxy configured)', async () => {
    // 8 failures are on record for this network from the parallel guesses above; the limit is 30.
    for (let i = 0; i < 22; i++) {
      const response = await new ApiClient(own.server.baseURL).request('POST', '/api/auth/login', { email: `spray-${i}@example.test`, password: 'guess' }, { 'x-forwarded-for': `198.51.100.${i}` })
      expect(response.status).toBe(401)
    }
    const next = await new ApiClient(own.server.baseURL).request('POST', '/api/auth/login', { email: 'client3@tidewright.test', password: PASSWORD }, { 'x-forwarded-for': '203.0.113.200' })
    expect(next.status).toBe(429)
  })
})

describe('IPv6 clients behind a trusted proxy', () => {
  // RFC 6177 / RFC 7934: a host is normally given a whole /64, so the network limit (30
  // failures in 15 minutes) counts the /64, not each of its 2^64 addresses.
  let proxied: OwnServer
  beforeAll(async () => {
    proxied = await startOwnServer({ NUXT_TRUST_PROXY: '1' })
  })
  afterAll(async () => {
    await proxied?.cleanup()
  })

  it('counts failures from every address of one /64 together, and a neighbouring /64 apart', async () => {
    for (let i = 0; i < 30; i++) {
      const from = `2001:db8:1:2:${(0xa000 + i).toString(16)}::${i + 1}`
      const response = await new ApiClient(proxied.server.baseURL).request('POST', '/api/auth/login', { email: `rotating-${i}@example.test`, password: 'guess' }, { 'x-forwarded-for': from })
      expect(response.status, from).toBe(401)
    }
    const sameNetwork = await new ApiClient(proxied.server.baseURL).request('POST', '/api/auth/login', { email: 'client3@tidewright.test', password: PASSWORD }, { 'x-forwarded-for': '2001:db8:1:2:ffff:ffff:ffff:fffe' })
    console.log(`[throttle] 30 failures from 30 addresses of one /64, then a right password from a 31st: ${sameNetwork.status}`)
    expect(sameNetwork.status).toBe(429)
    const nextNetwork = await new ApiClient(proxied.server.baseURL).request('POST', '/api/auth/login', { email: 'client3@tidewright.test', password: PASSWORD }, { 'x-forwarded-for': '2001:db8:1:3::1' })
    expect(nextNetwork.status).toBe(200)
  })
})
