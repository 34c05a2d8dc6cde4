/**
 * One handler contract: auth, then params, then body. A row the actor may not see is a 404
 * whatever the body says, so a wrong body never tells anyone that the row exists. For every
 * route in the access matrix with an id in its path that reads a body, an invalid body is
 * sent for ids nobody has (a random uuid) and for the real row by each persona the matrix
 * refuses; the answer must be the 404 (or 401/403) the matrix designs, never a 400.
 *
 * One list envelope (shared/types/list.ts): every GET route is called as a persona it
 * answers 200, and a JSON answer that is a bare array fails; `items` is always an array,
 * and a paged list carries total, page and pageSize. Each route's doc comment may not
 * promise a bare array either, which also covers the routes the matrix server keeps off.
 */
import { readFileSync } from 'node:fs'
import * as v from 'valibot'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { declaredRoutes } from '../support/route-tree'
import { ACCESS_MATRIX, PERSONAS, type MatrixContext, type MatrixEntry, type Persona } from './access-matrix.data'
import { matrixContext, personaSessions } from './matrix-context'

/** Valid JSON (a bare string, sent as written) that no route's body schema accepts: every body is an object. */
const INVALID_BODY = '"not an object"'

let own: OwnServer
beforeAll(async () => {
  own = await startOwnServer()
  as = personaSessions(own)
})
afterAll(async () => {
  await own?.cleanup()
})

let as: (persona: Persona) => Promise<ApiClient>
const context = (): MatrixContext => matrixContext(own, as)

/** Routes with an `[id]`-style segment whose handler reads a body (a valibot schema or an upload). */
const withIdAndBody = Object.entries(ACCESS_MATRIX).filter(([key, entry]) =>
  /\/\[(?!\.\.\.)[^\]]+\]/.test(key) && typeof entry.fuzz === 'object')

type BodyEntry = MatrixEntry & { fuzz: Exclude<MatrixEntry['fuzz'], 'no-body' | undefined> }

/** The route's path with its id segments replaced: every one (`all`) or only the last one. */
function withRandomIds(template: string, url: string, which: 'all' | 'last'): string {
  const pattern = template.split('/')
  const parts = url.split('?')[0]!.split('/')
  expect(parts.length, `${url} follows ${template}`).toBe(pattern.length)
  const ids = pattern.flatMap((segment, i) => segment.startsWith('[') ? [i] : [])
  for (const i of which === 'all' ? ids : ids.slice(-1)) parts[i] = crypto.randomUUID()
  return parts.join('/')
}

describe('params before body', () => {
  it('covers the routes that take an id and a body', () => {
    expect(withIdAndBody.length).toBeGreaterThan(20)
  })

  it('the invalid body is one every body schema rejects', () => {
    for (const [key, entry] of withIdAndBody) {
      const fuzz = (entry as BodyEntry).fuzz
      if ('schema' in fuzz) expect(v.safeParse(fuzz.schema, JSON.parse(INVALID_BODY)).success, key).toBe(false)
    }
  })

  for (const [key, matrixEntry] of withIdAndBody) {
    const entry = matrixEntry as BodyEntry
    const [method, template] = key.split(' ') as [string, string]
    it(`${key}: an invalid body for a row the actor cannot see is refused as the row, not the body`, async () => {
      const wrong: string[] = []
      const user = await as(entry.fuzz.as)
      const url = await entry.url(context())
      const guesses = [withRandomIds(template, url, 'all')]
      if (template.split('[').length > 2) guesses.push(withRandomIds(template, url, 'last'))
      for (const guess of guesses) {
        const response = await user.request(method, guess, INVALID_BODY)
        if (response.status !== 404) wrong.push(`${entry.fuzz.as} on ${guess}: ${response.status} (${JSON.stringify(response.body).slice(0, 120)})`)
      }
      for (const persona of PERSONAS) {
        const designed = entry.expect[persona]
        // Refused before the body is read (401, 403, 404); a 409 is a check on a row the persona may see.
        if (![401, 403, 404].includes(designed)) continue
        const response = await (await as(persona)).request(method, await entry.url(context()), INVALID_BODY)
        if (response.status !== designed) wrong.push(`${persona} on the real row: ${response.status}, designed ${designed} (${JSON.stringify(response.body).slice(0, 120)})`)
      }
      expect(wrong).toEqual([])
    })
  }
})

/** GET routes the matrix calls for a JSON answer: not event streams. */
const jsonGets = Object.entries(ACCESS_MATRIX).filter(([key, entry]) => key.startsWith('GET ') && !entry.stream)

/** What is wrong with a 200 answer's shape as a list, or null: a bare array, `items` not an array, half a page. */
function envelopeProblem(body: unknown): string | null {
  if (Array.isArray(body)) return 'a bare array; answer { items: [...] }'
  if (!body || typeof body !== 'object' || !('items' in body)) return null
  const list = body as Record<string, unknown>
  if (!Array.isArray(list.items)) return '`items` is not an array'
  const paging = ['total', 'page', 'pageSize'].filter(key => key in list)
  if (paging.length && paging.length < 3) return `a page needs total, page and pageSize; it has only ${paging.join(', ')}`
  if (paging.some(key => typeof list[key] !== 'number')) return 'total, page and pageSize must be numbers'
  return null
}

describe('one list envelope', () => {
  it('judges a bare array, a non-array items and half a page as wrong, and an envelope as right', () => {
    expect(envelopeProblem([{ id: 'a' }])).not.toBeNull()
    expect(envelopeProblem({ items: { id: 'a' } })).not.toBeNull()
    expect(envelopeProblem({ items: [], total: 3 })).not.toBeNull()
    expect(envelopeProblem({ items: [], total: '3', page: 1, pageSize: 25 })).not.toBeNull()
    expect(envelopeProblem({ items: [], total: 3, page: 1, pageSize: 25 })).toBeNull()
    expect(envelopeProblem({ items: [], unread: 0 })).toBeNull()
    expect(envelopeProblem({ name: 'one tank' })).toBeNull()
  })

  it('every GET route answers a list as { items } and never as a bare array', async () => {
    const wrong: string[] = []
    let lists = 0
    for (const [key, entry] of jsonGets) {
      const persona = PERSONAS.find(p => entry.expect[p] === 200)
      if (!persona) continue
      const response = await (await as(persona)).get(await entry.url(context()))
      if (response.status !== 200 || !response.headers.get('content-type')?.includes('json')) continue
      const problem = envelopeProblem(response.body)
      if (problem) wrong.push(`${key} as ${persona}: ${problem}`)
      else if (response.body && typeof response.body === 'object' && 'items' in response.body) lists++
    }
    expect(wrong).toEqual([])
    // The tank, reading, event, client, people, audit, alert, notification, session, review, site and staff lists.
    expect(lists).toBeGreaterThanOrEqual(12)
  })

  it('no GET route doc comment promises a bare array', () => {
    const promises = declaredRoutes()
      .filter(route => route.method === 'GET')
      .flatMap((route) => {
        const returns = /Returns ([^.\n]*)/.exec(readFileSync(route.file, 'utf8'))?.[1] ?? ''
        return /\[\]\s*$/.test(returns.trim()) ? [`${route.key}: Returns ${returns.trim()}`] : []
      })
    expect(promises).toEqual([])
  })
})
