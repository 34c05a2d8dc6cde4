/**
 * Compressed answers: pages and JSON come Brotli-compressed for a browser that offers it
 * (gzip for one that offers only gzip) and plain for a client that asks for nothing, with
 * Vary: Accept-Encoding and the security headers kept; scripts come from the copies
 * compressed at build time. Server-sent events and files that are compressed already
 * (uploaded PDFs) pass untouched. Raw node:http, because fetch would undo the encoding.
 */
import { request, type IncomingHttpHeaders } from 'node:http'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { TINY_PDF, fileForm } from './access-matrix.data'

const CHROMIUM_OFFERS = 'gzip, deflate, br, zstd'

interface RawAnswer { status: number, headers: IncomingHttpHeaders, body: Buffer }

/** One GET with exactly the headers given (no Accept-Encoding unless given), body as sent. */
function rawGet(baseURL: string, path: string, headers: Record<string, string> = {}): Promise<RawAnswer> {
  return new Promise((resolve, reject) => {
    const req = request(new URL(path, baseURL), { headers }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', chunk => chunks.push(chunk))
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }))
    })
    req.on('error', reject)
    req.end()
  })
}

/** The headers of an answer that never ends (an event stream); the connection is then dropped. */
function rawHeaders(baseURL: string, path: string, headers: Record<string, string>): Promise<{ status: number, headers: IncomingHttpHeaders }> {
  return new Promise((resolve, reject) => {
    const req = request(new URL(path, baseURL), { headers }, (res) => {
      resolve({ status: res.statusCode ?? 0, headers: res.headers })
      req.destroy()
    })
    req.on('error', reject)
    req.end()
  })
}

function decoded(answer: RawAnswer): string {
  const coding = answer.headers['content-encoding']
  const bytes = coding === 'br' ? brotliDecompressSync(answer.body) : coding === 'gzip' ? gunzipSync(answer.body) : answer.body
  return bytes.toString('utf8')
}

/** A page differs per request only in its CSP nonce and the anonymous session's id in its payload. */
const samePage = (html: string) => html.replace(/nonce-[A-Za-z0-9+/=]+/g, 'nonce').replace(/nonce="[^"]*"/g, 'nonce=""')
  .replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g, 'id')

let own: OwnServer
let base: string
beforeAll(async () => {
  own = await startOwnServer()
  base = own.server.baseURL
})
afterAll(async () => {
  await own?.cleanup()
})

describe('compressed pages and JSON', () => {
  it('sends the sign-in page as Brotli to Chromium, gzip to a gzip-only client and plain to one that asks for neither, the same page each time', async () => {
    const br = await rawGet(base, '/login', { 'accept-encoding': CHROMIUM_OFFERS })
    const gzip = await rawGet(base, '/login', { 'accept-encoding': 'gzip' })
    const plain = await rawGet(base, '/login')
    expect([br.status, gzip.status, plain.status]).toEqual([200, 200, 200])
    expect([br.headers['content-encoding'], gzip.headers['content-encoding'], plain.headers['content-encoding']]).toEqual(['br', 'gzip', undefined])
    for (const answer of [br, gzip, plain]) {
      expect(answer.headers.vary).toMatch(/accept-encoding/i)
      expect(answer.headers['content-type']).toMatch(/^text\/html/)
      expect(answer.headers['content-security-policy']).toMatch(/script-src/)
      expect(answer.headers['x-frame-options']).toBeDefined()
    }
    expect(plain.body.toString('utf8')).toContain('<html')
    expect(br.body.length).toBeLessThan(plain.body.length / 2)
    expect(samePage(decoded(br))).toBe(samePage(plain.body.toString('utf8')))
    expect(samePage(decoded(gzip))).toBe(samePage(plain.body.toString('utf8')))
  })

  it('compresses a signed-in JSON answer and keeps it private and unstored', async () => {
    const api = await new ApiClient(base).signIn('aquarist@tidewright.test')
    const path = `/api/tanks/${own.fixtures.demo.tanks.lounge}/readings`
    const cookie = api.cookieHeader()
    const compressed = await rawGet(base, path, { cookie, 'accept-encoding': 'gzip' })
    const plain = await rawGet(base, path, { cookie })
    expect([compressed.status, plain.status]).toEqual([200, 200])
    expect(plain.body.length).toBeGreaterThan(1024)
    expect(compressed.headers['content-encoding']).toBe('gzip')
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(compressed.headers['content-type']).toMatch(/^application\/json/)
    expect(compressed.headers['cache-control']).toBe('private, no-store')
    expect(JSON.parse(decoded(compressed))).toEqual(JSON.parse(plain.body.toString('utf8')))
  })

  it('serves the page\'s scripts from their build-time Brotli copies, and plain to a client that asks for nothing', async () => {
    const html = (await rawGet(base, '/login')).body.toString('utf8')
    const script = html.match(/src="(\/_nuxt\/[^"]+\.js)"/)?.[1]
    expect(script).toBeDefined()
    const br = await rawGet(base, script!, { 'accept-encoding': CHROMIUM_OFFERS })
    const plain = await rawGet(base, script!)
    expect(br.headers['content-encoding']).toBe('br')
    expect(br.headers.vary).toMatch(/accept-encoding/i)
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(decoded(br)).toBe(plain.body.toString('utf8'))
  })
})

describe('error pages', () => {
  it('arrive whole and readable whatever the browser accepts: a page that does not exist, and a page for another role', async () => {
    const client = await new ApiClient(base).signIn('client@tidewright.test')
    for (const path of ['/no-such-page', '/admin']) {
      for (const accept of [CHROMIUM_OFFERS, 'gzip', '']) {
        const answer = await rawGet(base, path, { 'cookie': client.cookieHeader(), 'accept-encoding': accept })
        expect(answer.status, `${path} ${accept}`).toBeGreaterThanOrEqual(400)
        expect(decoded(answer), `${path} ${accept}`).toContain('</html>')
      }
    }
  })
})

describe('answers that stay as they are', () => {
  it('does not compress the notification stream', async () => {
    const api = await new ApiClient(base).signIn('client@tidewright.test')
    const stream = await rawHeaders(base, '/api/notifications/stream', { 'cookie': api.cookieHeader(), 'accept-encoding': CHROMIUM_OFFERS })
    expect(stream.status).toBe(200)
    expect(stream.headers['content-type']).toMatch(/^text\/event-stream/)
    expect(stream.headers['content-encoding']).toBeUndefined()
  })

  it('sends an uploaded PDF byte for byte, not compressed again', async () => {
    const { demo } = own.fixtures
    const aquarist = await new ApiClient(base).signIn('aquarist@tidewright.test')
    const stage = queryFile<{ id: string }>(own.dbPath, 'select id from plan_stages where tank_id = ? order by position limit 1', demo.tanks.lounge)[0]!.id
    // Large and repetitive enough that compression would be applied if the type allowed it.
    const pdf = Buffer.concat([TINY_PDF, Buffer.from(`%${'tidewright '.repeat(400)}\n`)])
    const uploaded = await aquarist.request('POST', `/api/tanks/${demo.tanks.lounge}/stages/${stage}/uploads`, fileForm(pdf, 'leak-test.pdf', 'application/pdf'))
    expect(uploaded.status).toBe(201)
    const served = await rawGet(base, `/api/uploads/${uploaded.body.id}`, { 'cookie': aquarist.cookieHeader(), 'accept-encoding': CHROMIUM_OFFERS })
    expect(served.status).toBe(200)
    expect(served.headers['content-encoding']).toBeUndefined()
    expect(served.body.equals(pdf)).toBe(true)
  })
})
