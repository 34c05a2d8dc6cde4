/**
 * Every API route against every persona: the exact status the matrix in
 * access-matrix.data.ts designs, no other tenant's data in any answer, error answers
 * without internals, and the cross-site guard on every state-changing route.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient } from '../support/http'
import { fingerprint } from '../support/db-checksum'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { declaredRoutes } from '../support/route-tree'
import { forbiddenFor, leaksIn } from '../support/tenancy'
import { ACCESS_MATRIX, MODULE_ROUTES, PERSONAS, PERSONA_EMAIL, type MatrixContext, type MatrixEntry, type Persona } from './access-matrix.data'
import { matrixContext } from './matrix-context'

let own: OwnServer
const sessions = new Map<Persona, ApiClient>()
const forbidden = new Map<Persona, string[]>()

beforeAll(async () => {
  own = await startOwnServer()
  for (const persona of PERSONAS) {
    forbidden.set(persona, persona === 'signedOut' ? forbiddenFor(own.dbPath, PERSONA_EMAIL.client).concat(forbiddenFor(own.dbPath, PERSONA_EMAIL.otherCompany)) : forbiddenFor(own.dbPath, PERSONA_EMAIL[persona]))
  }
})
afterAll(async () => {
  await own?.cleanup()
})

async function clientFor(persona: Persona, fresh: boolean): Promise<ApiClient> {
  if (persona === 'signedOut') return new ApiClient(own.server.baseURL)
  const cached = sessions.get(persona)
  if (cached && !fresh) return cached
  const api = await new ApiClient(own.server.baseURL).signIn(PERSONA_EMAIL[persona])
  if (!fresh) sessions.set(persona, api)
  return api
}

const context = (): MatrixContext => matrixContext(own, persona => clientFor(persona, false))

function methodsOf(key: string, entry: MatrixEntry): string[] {
  const method = key.split(' ')[0]!
  return method === 'ANY' ? entry.methods ?? ['GET'] : [method]
}

function bodyFor(key: string, entry: MatrixEntry, persona: Persona): unknown {
  const body = entry.body?.(context())
  if (key === 'POST /api/auth/login') return { ...(body as object), email: PERSONA_EMAIL[persona === 'signedOut' ? 'client' : persona] }
  return body
}

async function call(key: string, entry: MatrixEntry, method: string, persona: Persona, headers: Record<string, string> = {}, preparedUrl?: string) {
  const api = await clientFor(persona, entry.freshSession === true)
  const url = preparedUrl ?? await entry.url(context())
  const body = bodyFor(key, entry, persona)
  if (entry.stream) {
    // Read the status and headers of the event stream, then hang up.
    const abort = new AbortController()
    const response = await fetch(`${own.server.baseURL}${url}`, { headers: { cookie: api.cookieHeader(), ...headers }, signal: abort.signal })
    const text = response.status >= 400 ? await response.text() : ''
    abort.abort()
    let parsed: unknown = text
    try {
      parsed = text ? JSON.parse(text) : text
    }
    catch { /* not JSON */ }
    return { url, response: { status: response.status, headers: response.headers, body: parsed as any } }
  }
  return { url, response: await api.request(method, url, body ?? (method === 'GET' || method === 'DELETE' ? undefined : {}), headers) }
}

describe('the access matrix', () => {
  it('has exactly one entry per route file under server/api', () => {
    const declared = declaredRoutes().map(route => route.key)
    const listed = Object.keys(ACCESS_MATRIX)
    expect(declared.filter(key => !listed.includes(key)), 'route files without a matrix entry').toEqual([])
    expect(listed.filter(key => !declared.includes(key)), 'matrix entries without a route file').toEqual([])
  })

  const all = { ...ACCESS_MATRIX, ...MODULE_ROUTES }
  for (const [key, entry] of Object.entries(all)) {
    it(`${key}: the designed status for every persona, and nobody else's data`, async () => {
      const wrong: string[] = []
      for (const method of methodsOf(key, entry)) {
        for (const persona of PERSONAS) {
          const { url, response } = await call(key, entry, method, persona)
          const text = typeof response.body === 'string' ? response.body : JSON.stringify(response.body)
          if (response.status !== entry.expect[persona]) wrong.push(`${method} as ${persona}: ${response.status}, designed ${entry.expect[persona]} (${text.slice(0, 120)})`)
          // Signing in while signed out makes you client@: judge that answer by what client@ may see.
          const viewer = key === 'POST /api/auth/login' && persona === 'signedOut' ? 'client' : persona
          const disclosed = new Set(entry.discloses?.(context()) ?? [])
          const leaks = leaksIn(text, forbidden.get(viewer)!.filter(s => !disclosed.has(s)), url)
          if (leaks.length) wrong.push(`${method} as ${persona} received data it may not see: ${leaks.join(', ')}`)
          if (response.status >= 400) {
            const error = response.body as { statusCode?: number, statusMessage?: string, stack?: unknown }
            if (typeof error !== 'object' || error.statusCode !== response.status || !error.statusMessage) wrong.push(`${method} as ${persona}: error answer is not JSON with a message: ${text.slice(0, 120)}`)
            if (/"stack"|\bat .+\.(m?js|ts):\d+|\/server\/|node_modules/.test(text)) wrong.push(`${method} as ${persona}: error answer shows internals: ${text.slice(0, 200)}`)
          }
        }
      }
      expect(wrong).toEqual([])
    })
  }
})

describe('cross-site requests', () => {
  const stateChanging = Object.entries({ ...ACCESS_MATRIX, ...MODULE_ROUTES }).flatMap(([key, entry]) =>
    methodsOf(key, entry).filter(method => !['GET', 'HEAD', 'OPTIONS'].includes(method)).map(method => ({ key, entry, method })))

  it('covers at least the sign-in and sign-out routes', () => {
    expect(stateChanging.map(s => s.key)).toEqual(expect.arrayContaining(['POST /api/auth/login', 'POST /api/auth/logout']))
  })

  for (const { key, entry, method } of stateChanging) {
    it(`${method} ${key.split(' ')[1]}: refused from another site's page and changes nothing, allowed from our own`, async () => {
      // The persona for whom the call would otherwise succeed (or the admin when nobody may).
      const persona = PERSONAS.find(p => entry.expect[p] < 400) ?? 'admin'
      const url = await entry.url(context())
      const before = fingerprint(own.dbPath)
      for (const origin of ['https://elsewhere.example', 'null', `${own.server.baseURL}.elsewhere.example`]) {
        const { response } = await call(key, entry, method, persona, { origin }, url)
        expect(response.status, `${method} ${key} as ${persona} from ${origin}`).toBe(403)
        expect(response.body.statusMessage).toBe('Cross-site request refused')
      }
      expect(fingerprint(own.dbPath)).toEqual(before)
      const { response } = await call(key, entry, method, persona, { origin: own.server.baseURL }, url)
      expect(response.status, `${method} ${key} as ${persona} from our own origin`).toBe(entry.expect[persona])
    })
  }
})
