/**
 * Headers and addresses: API answers are never cached, HSTS comes with the Secure session
 * cookie, and X-Forwarded-Host (a header any client can send) is not believed
 * unless a trusted proxy is configured.
 */
import { describe, expect, inject, it } from 'vitest'
import { ApiClient } from '../support/http'

describe('response headers', () => {
  it('marks authenticated JSON and CSV private and never stored, with HSTS beside the Secure cookie', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lounge
    for (const path of ['/api/me', '/api/tanks', `/api/tanks/${tank}/readings`, `/api/tanks/${tank}/readings/export.csv`]) {
      const response = await api.get(path)
      expect(response.status, path).toBe(200)
      expect(response.headers.get('cache-control'), path).toBe('private, no-store')
      expect(response.headers.get('strict-transport-security'), path).toMatch(/max-age=\d{7,}/)
    }
    const signIn = await new ApiClient().post('/api/auth/login', { email: 'client@tidewright.test', password: 'tidewright-demo' })
    expect(signIn.headers.getSetCookie().find(c => c.startsWith('tidewright-session='))).toMatch(/Secure/i)
    expect(signIn.headers.get('strict-transport-security')).toMatch(/max-age=/)
  })
})

describe('forwarded headers', () => {
  it('does not let X-Forwarded-Host make another site\'s page look like our own', async () => {
    const api = await new ApiClient().signIn('client@tidewright.test')
    const forged = await api.request('POST', '/api/notifications/read-all', {}, { 'origin': 'https://elsewhere.example', 'x-forwarded-host': 'elsewhere.example' })
    expect(forged.status).toBe(403)
  })
})
