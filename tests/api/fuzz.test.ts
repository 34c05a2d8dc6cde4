/**
 * Property-based fuzzing of every POST, PUT and PATCH route in the access matrix (fixed
 * seed, a modest number of runs per route). A body the route's schema rejects must get
 * a 4xx with a message, must not echo the input, and must leave every table of the
 * database byte-for-byte as it was. No body, however hostile, may cause a 5xx.
 */
import fc from 'fast-check'
import * as v from 'valibot'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { readdirSync, existsSync } from 'node:fs'
import { join } from 'node:path'
import { fingerprint, queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { ECHO_MARKER, hostileBodies, hostileValueText } from '../support/hostile'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { ACCESS_MATRIX, PERSONA_EMAIL, TINY_PDF, TINY_PNG, fileForm, type MatrixContext, type Persona } from './access-matrix.data'
import { matrixContext, personaSessions } from './matrix-context'

const SEED = 20261201
const RUNS = 40

/** fc.assert with a readable report: hostile bodies can be megabytes long, so the counterexample is cut short. */
async function assertProperty<T>(property: fc.IAsyncProperty<T>): Promise<void> {
  const result = await fc.check(property, { seed: SEED, numRuns: RUNS })
  if (result.failed) throw new Error(fc.defaultReportMessage(result)?.replace(/x{200,}/g, m => `x...(${m.length} x)`).slice(0, 4000))
}

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

/** Every file under the uploads directory (bytes must not be left behind by a refused upload). */
function storedFiles(): string[] {
  const dir = join(own.dir, 'uploads')
  if (!existsSync(dir)) return []
  return readdirSync(dir, { recursive: true }).map(String).sort()
}

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

    if (typeof plan === 'object' && 'upload' in plan) {
      it(`${key}: wrong, lying, empty, oversize and oddly named files are refused with a 4xx and leave nothing behind`, async () => {
        const api = await as(plan.as)
        const url = await entry.url(context())
        const junk = fc.uint8Array({ minLength: 1, maxLength: 4096 }).filter(b => !(b[0] === 0xFF || b[0] === 0x89 || b[0] === 0x52 || b[0] === 0x25))
        const refusedFile = fc.oneof(
          fc.tuple(junk, fc.constantFrom('photo.png', 'scan.pdf', 'shot.jpg', 'image.webp', 'noextension', 'script.svg', 'page.html')).map(([bytes, name]) => ({ bytes: Buffer.from(bytes), name, type: 'image/png', status: 415 })),
          fc.constantFrom(
            { bytes: TINY_PDF, name: 'holiday.png', type: 'image/png', status: 415 },
            { bytes: TINY_PNG, name: 'report.pdf', type: 'application/pdf', status: 415 },
            { bytes: TINY_PNG, name: 'photo.jpg', type: 'image/jpeg', status: 415 },
            { bytes: TINY_PDF, name: 'evil.html', type: 'text/html', status: 415 },
            { bytes: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), name: 'x.svg', type: 'image/svg+xml', status: 415 },
            { bytes: Buffer.alloc(0), name: 'empty.png', type: 'image/png', status: 400 },
            // PNG signature on bytes that are not an image: must not reach storage.
            { bytes: Buffer.concat([TINY_PNG.subarray(0, 8), Buffer.alloc(64, 1)]), name: 'broken.png', type: 'image/png', status: 415 },
          ),
        )
        const before = { db: fingerprint(own.dbPath), files: storedFiles() }
        await assertProperty(fc.asyncProperty(refusedFile, async (file) => {
          const response = await api.request('POST', url, fileForm(file.bytes, file.name, file.type))
          expect(response.status, JSON.stringify(response.body)).toBe(file.status)
          expect(response.body.data.issues[0].message).toMatch(/\S/)
        }))
        // Oversize (just past the 10 MB limit), not multipart, and the wrong field name.
        const oversize = await api.request('POST', url, fileForm(Buffer.concat([TINY_PDF, Buffer.alloc(10 * 1024 * 1024)]), 'big.pdf', 'application/pdf'))
        expect(oversize.status).toBe(413)
        const notMultipart = await api.post(url, { file: TINY_PDF.toString('base64') })
        expect(notMultipart.status).toBe(400)
        const wrongField = new FormData()
        wrongField.append('photo', new Blob([new Uint8Array(TINY_PDF)]), 'x.pdf')
        expect((await api.request('POST', url, wrongField)).status).toBe(400)
        expect(fingerprint(own.dbPath)).toEqual(before.db)
        expect(storedFiles()).toEqual(before.files)
      })

      it(`${key}: path-traversal and control characters in file names never reach a path`, async () => {
        const api = await as(plan.as)
        const url = await entry.url(context())
        for (const name of ['../../../../etc/passwd.pdf', '..\\..\\windows\\system.pdf', '/absolute/path.pdf', 'nul\u0000byte.pdf', `${'a'.repeat(5000)}.pdf`, '.pdf', '%2e%2e%2fescape.pdf']) {
          const response = await api.request('POST', url, fileForm(TINY_PDF, name, 'application/pdf'))
          expect(response.status, name).toBe(201)
          const stored = queryFile<{ original_name: string, storage_key: string }>(own.dbPath, 'select original_name, storage_key from uploads where id = ?', response.body.id)[0]!
          expect(stored.original_name).not.toMatch(/[\\/]/)
          expect(stored.original_name.includes('\u0000')).toBe(false)
          expect(stored.original_name.length).toBeLessThanOrEqual(120)
          expect(stored.storage_key).not.toContain('..')
          const back = await api.request('GET', `/api/uploads/${response.body.id}`)
          expect(back.status).toBe(200)
        }
        // Nothing was written outside the uploads directory.
        expect(existsSync(join(own.dir, 'etc'))).toBe(false)
        expect(storedFiles().every(f => !f.includes('..'))).toBe(true)
      })
      continue
    }

    if (plan === 'no-body') {
      it(`${key}: any body at all, never a 5xx`, async () => {
        const api = await new ApiClient(own.server.baseURL).signIn(PERSONA_EMAIL.client)
        const url = await entry.url(context())
        await assertProperty(fc.asyncProperty(hostileValueText, async (text) => {
          const response = await api.request(method, url, text, { 'content-type': 'application/json' })
          expect(response.status).toBeLessThan(500)
        }))
      })
      continue
    }

    it(`${key}: rejected bodies get a 4xx with a message and change nothing; none gets a 5xx`, async () => {
      const api = await new ApiClient(own.server.baseURL).signIn(PERSONA_EMAIL[plan.as])
      const valid = await plan.validBody(context())
      const url = await entry.url(context())
      let rejected = 0
      await assertProperty(fc.asyncProperty(hostileBodies(valid), async (text) => {
        const parsed = parsedOrUndefined(text)
        const accepted = parsed.ok && v.safeParse(plan.schema, parsed.value).success
        fc.pre(!(accepted && plan.onlyRejected))
        const before = accepted ? undefined : fingerprint(own.dbPath)
        const response = await api.request(method, url, text, { 'content-type': 'application/json' })
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
      }))
      expect(rejected).toBeGreaterThan(RUNS / 2)
      // Poisoned keys did not change who the server thinks we are.
      const me = await api.get('/api/me')
      expect(me.status).toBe(200)
      expect(me.body.role).toBe({ admin: 'admin', aquarist: 'aquarist', supervisor: 'supervisor', client: 'client', otherClient: 'client', otherCompany: 'aquarist' }[plan.as])
    })
  }
})
