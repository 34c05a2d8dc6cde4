/**
 * No secrets or internals leave the server: error answers carry no stack, file path or
 * session secret, and the server's own log holds neither the session secret nor a
 * password. Uploaded files are reachable only through the access-checked API route,
 * never at a public path.
 */
import { existsSync, readdirSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { TINY_PDF, fileForm, READING_BODY } from './access-matrix.data'

let own: OwnServer
beforeAll(async () => {
  own = await startOwnServer()
})
afterAll(async () => {
  await own?.cleanup()
})

const INTERNALS = /"stack"|\n\s+at |\bat [\w.<>]+ \(|\/work\/|\.output\/|node_modules|\/server\/(api|utils)\/|file:\/\//

function problemsIn(text: string): string[] {
  const found: string[] = []
  if (INTERNALS.test(text)) found.push(`internals: ${text.match(INTERNALS)?.[0]}`)
  if (text.includes(own.sessionPassword)) found.push('the session secret')
  if (text.includes('tidewright-demo')) found.push('a password')
  return found
}

describe('errors and logs', () => {
  it('answers broken, hostile and unknown requests without internals or secrets', async () => {
    const { demo } = own.fixtures
    const signedOut = new ApiClient(own.server.baseURL)
    const aquarist = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
    const forged = new ApiClient(own.server.baseURL)
    const raw = (path: string, init: RequestInit = {}) => fetch(`${own.server.baseURL}${path}`, init).then(async r => ({ status: r.status, text: await r.text() }))
    const answers = [
      await raw('/api/tanks/%E0%A4%A'),
      await raw(`/api/tanks/${demo.tanks.lounge}`, { headers: { cookie: 'tidewright-session=Fe26.2**garbage*garbage' } }),
      await raw('/api/me', { headers: { cookie: `tidewright-session=${'x'.repeat(6000)}` } }),
      await raw('/api/auth/login', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"email": "client@tidewright.test", "password": "tidewright-demo"' }),
      await raw('/api/auth/login', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'a@b.test', password: 'x'.repeat(3_000_000) }) }),
      await raw('/api/auth/login', { method: 'POST', headers: { 'content-type': 'application/xml' }, body: '<login/>' }),
      await raw('/api/no-such-route', { method: 'PUT' }),
      await raw(`/api/tanks/${demo.tanks.lounge}/readings`, { method: 'POST', headers: { 'content-type': 'application/json', 'cookie': aquarist.cookieHeader() }, body: '{"takenAt": {"$gt": ""}, "ammonia": "1e999"}' }),
      await raw(`/api/tanks/${demo.tanks.lounge}/readings?page=-1&pageSize=1e9&sort=__proto__`, { headers: { cookie: aquarist.cookieHeader() } }),
      await raw(`/api/uploads/00000000-0000-4000-8000-000000000000`, { headers: { cookie: aquarist.cookieHeader() } }),
      await raw(`/api/tanks/${demo.tanks.lounge}/stages/00000000-0000-4000-8000-000000000000/uploads`, { method: 'POST', headers: { 'cookie': aquarist.cookieHeader(), 'content-type': 'multipart/form-data; boundary=broken' }, body: '--broken\r\nContent-Disposition: form-data; name="file"; filename="../x.pdf"\r\n\r\n%PDF-' }),
    ]
    for (const answer of answers) {
      expect(answer.status, answer.text.slice(0, 200)).toBeGreaterThanOrEqual(400)
      expect(answer.status, answer.text.slice(0, 200)).toBeLessThan(500)
      expect(problemsIn(answer.text), answer.text.slice(0, 300)).toEqual([])
    }
    // A forged cookie is simply signed out.
    expect((await forged.request('GET', '/api/me', undefined, { cookie: 'tidewright-session=Fe26.2**abc' })).status).toBe(401)
    expect((await signedOut.get('/api/me')).status).toBe(401)
  })

  it('keeps the session secret and passwords out of the server log', async () => {
    // Sign-ins (good and bad), writes and errors all ran against this server above and here.
    const api = await new ApiClient(own.server.baseURL).signIn('client@tidewright.test')
    await new ApiClient(own.server.baseURL).post('/api/auth/login', { email: 'client@tidewright.test', password: 'wrong-password-value' })
    expect((await api.post(`/api/tanks/${own.fixtures.demo.tanks.lounge}/readings`, READING_BODY())).status).toBe(201)
    const log = own.server.output()
    expect(log).not.toContain(own.sessionPassword)
    expect(log).not.toContain('tidewright-demo')
    expect(log).not.toContain('wrong-password-value')
    expect(log).not.toMatch(/\n\s+at .+:\d+:\d+/)
  })
})

describe('uploaded files', () => {
  it('are served only through /api/uploads/:id to users who may see the tank, never at a public path', async () => {
    const { demo } = own.fixtures
    const aquarist = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
    const stage = queryFile<{ id: string }>(own.dbPath, 'select id from plan_stages where tank_id = ? order by position limit 1', demo.tanks.lounge)[0]!.id
    const uploaded = await aquarist.request('POST', `/api/tanks/${demo.tanks.lounge}/stages/${stage}/uploads`, fileForm(TINY_PDF, 'leak-test.pdf', 'application/pdf'))
    expect(uploaded.status).toBe(201)
    const id = uploaded.body.id as string
    const { storage_key: key } = queryFile<{ storage_key: string }>(own.dbPath, 'select storage_key from uploads where id = ?', id)[0]!
    const base = own.server.baseURL
    for (const path of [`/${key}`, `/uploads/${id}`, `/uploads/${key}`, `/data/uploads/${key}`, `/_nuxt/${key}`, `/${id}`, `/uploads/${id}.pdf`, `/leak-test.pdf`, `/public/uploads/${key}`]) {
      const response = await fetch(`${base}${path.replaceAll(':', '%3A')}`, { headers: { cookie: aquarist.cookieHeader() } })
      const text = await response.text()
      expect(text.startsWith('%PDF'), path).toBe(false)
    }
    expect((await fetch(`${base}/api/uploads/${id}`)).status).toBe(401)
    expect((await (await new ApiClient(base).signIn('client2@tidewright.test')).get(`/api/uploads/${id}`)).status).toBe(404)
    const served = await fetch(`${base}/api/uploads/${id}`, { headers: { cookie: aquarist.cookieHeader() } })
    expect(served.status).toBe(200)
    expect(Buffer.from(await served.arrayBuffer()).equals(TINY_PDF)).toBe(true)
    expect(served.headers.get('x-content-type-options')).toBe('nosniff')
    // The build's public folder holds no uploads, and the storage folder lies outside it.
    const publicDir = resolve('.output/public')
    expect(readdirSync(publicDir, { recursive: true }).map(String).some(f => /uploads/i.test(f))).toBe(false)
    expect(resolve(join(own.dir, 'uploads')).startsWith(publicDir)).toBe(false)
    expect(existsSync(join(own.dir, 'uploads'))).toBe(true)
  })
})

describe('password rules on reset', () => {
  it('refuses short passwords and the e-mail address, accepts a good one once, and never logs either', async () => {
    const email = 'client3@tidewright.test'
    const anonymous = new ApiClient(own.server.baseURL)
    expect((await anonymous.post('/api/auth/forgot-password', { email })).status).toBe(200)
    // No SMTP server here: the message waits in the outbox, where the link can be read.
    const [mail] = queryFile<{ text_body: string }>(own.dbPath, `select text_body from mail_outbox where to_address = ? and kind = 'reset' order by created_at desc limit 1`, email)
    const token = /reset-password\?token=([\w-]+)/.exec(mail!.text_body)![1]!
    const short = await anonymous.post('/api/auth/reset-password', { token, password: 'short-pw' })
    expect(short.status).toBe(400)
    expect(short.body.data.issues).toEqual([{ field: 'password', message: 'Use at least 10 characters.' }])
    const own_email = await anonymous.post('/api/auth/reset-password', { token, password: email })
    expect(own_email.status).toBe(400)
    expect(JSON.stringify(own_email.body)).not.toContain(email)
    const good = 'tide-pool-lantern-42'
    const ok = await anonymous.post('/api/auth/reset-password', { token, password: good })
    expect(ok.status).toBe(200)
    expect((await anonymous.post('/api/auth/reset-password', { token, password: 'another-good-password' })).status).toBe(410)
    expect((await new ApiClient(own.server.baseURL).post('/api/auth/login', { email, password: good })).status).toBe(200)
    const log = own.server.output()
    expect(log).not.toContain(good)
    expect(log).not.toContain(token)
    // Only a hash of the token is stored.
    expect(queryFile(own.dbPath, 'select 1 from auth_tokens where token_hash = ?', token)).toEqual([])
  })
})
