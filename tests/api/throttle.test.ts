/**
 * Throttles that hold when requests arrive together: sign-in attempts are reserved before
 * the password is checked, and password-reset mail is limited per address and per
 * network with the same answer either way. A server of its own, so the attempts counted
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
