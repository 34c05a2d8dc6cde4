/**
 * One handler contract: auth, then params, then body. A row the actor may not see is a 404
 * whatever the body says, so a wrong body never tells anyone that the row exists. For every
 * route in the access matrix with an id in its path that reads a body, an invalid body is
 * sent for ids nobody has (a random uuid) and for the real row by each persona the matrix
 * refuses; the answer must be the 404 (or 401/403) the matrix designs, never a 400.
 */
import * as v from 'valibot'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
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
