import { describe, expect, inject, it } from 'vitest'
import { ApiClient } from '../support/http'
import { LOCKOUT_EMAIL, PASSWORD } from '../support/fixtures'

describe('POST /api/auth/login', () => {
  it('signs a demo user in and returns their id, name and role only', async () => {
    const api = new ApiClient()
    const response = await api.post('/api/auth/login', { email: 'aquarist@tidewright.test', password: 'tidewright-demo' })
    expect(response.status).toBe(200)
    expect(response.body).toEqual({ user: { id: inject('fixtures').demo.users.aquarist, name: 'Teodor Nakamura-Reyes', role: 'aquarist' } })
    const cookie = response.headers.getSetCookie().find(c => c.startsWith('tidewright-session='))
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    expect(cookie).toMatch(/Secure/i)
    const me = await api.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.role).toBe('aquarist')
  })

  it('scopes the session cookie to this host and path, seals its contents, and expires it at sign-out', async () => {
    const api = new ApiClient()
    const response = await api.post('/api/auth/login', { email: 'client3@tidewright.test', password: 'tidewright-demo' })
    const cookie = response.headers.getSetCookie().find(c => c.startsWith('tidewright-session='))!
    expect(cookie).toMatch(/;\s*Path=\/(;|$)/i)
    expect(cookie).not.toMatch(/Domain=/i)
    const expires = Date.parse(/Expires=([^;]+)/i.exec(cookie)?.[1] ?? '')
    // nuxt.config session.maxAge: 7 days.
    expect(Math.abs(expires - (Date.now() + 7 * 86_400_000))).toBeLessThan(120_000)
    const value = decodeURIComponent(cookie.split(';')[0]!.split('=').slice(1).join('='))
    expect(value).toMatch(/^Fe26\.2\*/)
    for (const plain of ['client3', 'tidewright', inject('fixtures').demo.users.client3, 'client']) expect(value).not.toContain(plain)
    const out = await api.post('/api/auth/logout')
    const cleared = out.headers.getSetCookie().find(c => c.startsWith('tidewright-session='))
    expect(cleared).toBeDefined()
    const clearedExpiry = /Max-Age=(\d+)/i.exec(cleared!)?.[1]
    const clearedDate = Date.parse(/Expires=([^;]+)/i.exec(cleared!)?.[1] ?? '')
    expect(clearedExpiry === '0' || clearedDate < Date.now() || /^tidewright-session=;/.test(cleared!)).toBe(true)
  })

  it('accepts the e-mail in any case and with stray spaces', async () => {
    const response = await new ApiClient().post('/api/auth/login', { email: '  Supervisor@Tidewright.TEST ', password: 'tidewright-demo' })
    expect(response.status).toBe(200)
    expect(response.body.user.role).toBe('supervisor')
  })

  it('answers a wrong password and an unknown e-mail with the same 401 message', async () => {
    const wrongPassword = await new ApiClient().post('/api/auth/login', { email: 'admin@tidewright.test', password: 'not-the-password' })
    const unknownEmail = await new ApiClient().post('/api/auth/login', { email: 'nobody@tidewright.test', password: 'tidewright-demo' })
    expect(wrongPassword.status).toBe(401)
    expect(unknownEmail.status).toBe(401)
    expect(wrongPassword.body.statusMessage).toBe(unknownEmail.body.statusMessage)
    expect(wrongPassword.body.statusMessage).toBe('Wrong e-mail or password')
  })

  it('refuses malformed bodies with 400 and field messages, never echoing the password', async () => {
    const api = new ApiClient()
    const response = await api.post('/api/auth/login', { email: 'not-an-email', password: 'secret-value-123' })
    expect(response.status).toBe(400)
    expect(response.body.data.issues).toEqual([{ field: 'email', message: 'Enter a valid e-mail address.' }])
    expect(JSON.stringify(response.body)).not.toContain('secret-value-123')
    const broken = await api.request('POST', '/api/auth/login', '{"email": ', { 'content-type': 'application/json' })
    expect(broken.status).toBe(400)
    const wrongTypes = await api.post('/api/auth/login', { email: 42, password: ['x'] })
    expect(wrongTypes.status).toBe(400)
    expect(wrongTypes.body.data.issues.map((i: { field: string }) => i.field)).toEqual(['email', 'password'])
  })

  it('slows and then refuses repeated failures on one account with 429 and Retry-After', async () => {
    const api = new ApiClient()
    // A dedicated account: the lock lasts the whole window, and other test files sign in as the demo staff.
    const email = LOCKOUT_EMAIL
    const statuses: number[] = []
    for (let i = 0; i < 8; i++) {
      statuses.push((await api.post('/api/auth/login', { email, password: `guess-${i}` })).status)
    }
    expect(statuses).toEqual(Array(8).fill(401))
    const refused = await api.post('/api/auth/login', { email, password: PASSWORD })
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    // Another account from the same address is not locked out by this one.
    const other = await new ApiClient().post('/api/auth/login', { email: 'client2@tidewright.test', password: 'tidewright-demo' })
    expect(other.status).toBe(200)
  })

  it('signs out: the session no longer reaches the API', async () => {
    const api = await new ApiClient().signIn('client@tidewright.test')
    expect((await api.get('/api/tanks')).status).toBe(200)
    expect((await api.post('/api/auth/logout')).status).toBe(200)
    expect((await api.get('/api/tanks')).status).toBe(401)
  })

  it('refuses a state-changing call from another site\'s page', async () => {
    const response = await new ApiClient().request('POST', '/api/auth/login', { email: 'client@tidewright.test', password: 'tidewright-demo' }, { origin: 'https://elsewhere.example' })
    expect(response.status).toBe(403)
  })
})

describe('security headers', () => {
  it('serves a content security policy that allows only the app\'s own origin', async () => {
    const response = await fetch(`${inject('baseURL')}/login`)
    const csp = response.headers.get('content-security-policy') ?? ''
    expect(csp).toContain('default-src \'self\'')
    expect(csp).toContain('frame-ancestors \'none\'')
    expect(csp).toMatch(/script-src 'self' 'strict-dynamic' 'nonce-[A-Za-z0-9+/=]+'/)
    expect(response.headers.get('x-content-type-options')).toBe('nosniff')
    expect(response.headers.get('access-control-allow-origin')).toBeNull()
  })
})
