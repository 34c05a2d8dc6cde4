/**
 * Property-based fuzzing of every POST, PUT and PATCH route in the access matrix (fixed
 * seed, a modest number of runs per route). A body the route's schema rejects must get
 * a 4xx with a message, must not echo the input, and must leave every table of the
 * database byte-for-byte as it was. No body, however hostile, may cause a 5xx.
 */
import fc from 'fast-check'
import * as v from 'valibot'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fingerprint } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { ECHO_MARKER, hostileBodies, hostileValueText } from '../support/hostile'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { ACCESS_MATRIX, PERSONA_EMAIL } from './access-matrix.data'

const SEED = 20261201
const RUNS = 40

let own: OwnServer
beforeAll(async () => { own = await startOwnServer() })
afterAll(async () => { await own?.cleanup() })

const bodyRoutes = Object.entries(ACCESS_MATRIX).filter(([key]) => /^(POST|PUT|PATCH|ANY) /.test(key))

function parsedOrUndefined(text: string): { ok: true, value: unknown } | { ok: false } {
  try {
    return { ok: true, value: JSON.parse(text) }
  }
  catch {
    return { ok: false }
  }
}

describe('hostile request bodies', () => {
  it('every POST, PUT and PATCH route has a fuzz plan', () => {
    const missing = bodyRoutes.filter(([key, entry]) => !key.startsWith('ANY ') && !entry.fuzz).map(([key]) => key)
    expect(missing).toEqual([])
  })

  for (const [key, entry] of bodyRoutes) {
    const plan = entry.fuzz
    if (!plan) continue
    const method = key.startsWith('ANY ') ? 'POST' : key.split(' ')[0]!

    if (plan === 'no-body') {
      it(`${key}: any body at all, never a 5xx`, async () => {
        const api = await new ApiClient(own.server.baseURL).signIn(PERSONA_EMAIL.client)
        await fc.assert(fc.asyncProperty(hostileValueText, async (text) => {
          const response = await api.request(method, entry.url(own.fixtures), text, { 'content-type': 'application/json' })
          expect(response.status).toBeLessThan(500)
        }), { seed: SEED, numRuns: RUNS })
      })
      continue
    }

    it(`${key}: rejected bodies get a 4xx with a message and change nothing; none gets a 5xx`, async () => {
      const api = await new ApiClient(own.server.baseURL).signIn(PERSONA_EMAIL[plan.as])
      const valid = plan.validBody(own.fixtures)
      let rejected = 0
      await fc.assert(fc.asyncProperty(hostileBodies(valid), async (text) => {
        const parsed = parsedOrUndefined(text)
        const accepted = parsed.ok && v.safeParse(plan.schema, parsed.value).success
        fc.pre(!(accepted && plan.onlyRejected))
        const before = accepted ? undefined : fingerprint(own.dbPath)
        const response = await api.request(method, entry.url(own.fixtures), text, { 'content-type': 'application/json' })
        const answer = typeof response.body === 'string' ? response.body : JSON.stringify(response.body)
        expect(response.status, answer.slice(0, 300)).toBeLessThan(500)
        if (accepted) return
        rejected++
        expect(response.status, answer.slice(0, 300)).toBeGreaterThanOrEqual(400)
        expect(response.body.statusMessage, answer.slice(0, 300)).toEqual(expect.any(String))
        expect(response.body.message, answer.slice(0, 300)).toMatch(/\S/)
        expect(answer).not.toContain(ECHO_MARKER)
        expect(answer).not.toMatch(/"stack"|node_modules|\/server\//)
        expect(fingerprint(own.dbPath)).toEqual(before)
      }), { seed: SEED, numRuns: RUNS })
      expect(rejected).toBeGreaterThan(RUNS / 2)
      // Poisoned keys did not change who the server thinks we are.
      const me = await api.get('/api/me')
      expect(me.status).toBe(200)
      expect(me.body.role).toBe({ admin: 'admin', aquarist: 'aquarist', supervisor: 'supervisor', client: 'client', otherClient: 'client', otherCompany: 'aquarist' }[plan.as])
    })
  }
})
