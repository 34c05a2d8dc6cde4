/**
 * Request body limits count the bytes as they arrive, whatever the method and however
 * the body is framed (Content-Length or chunked): JSON routes take 64 KB, uploads 10 MB,
 * the CSV import its own larger limit. Past the limit the answer is 413, and a flood of
 * oversized chunked bodies leaves the server's memory flat.
 */
import { readFileSync } from 'node:fs'
import { request } from 'node:http'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { TINY_PDF, fileForm } from './access-matrix.data'

const MB = 1024 * 1024

interface Sent { status: number | null, error: string | null }

/**
 * Sends `total` bytes in chunks of `chunk` with Transfer-Encoding: chunked (no Content-Length),
 * the way a streaming client (or an attacker) would. The status is null if the server cut the connection.
 */
function sendChunked(baseURL: string, options: { method?: string, path: string, total: number, chunk?: number, headers?: Record<string, string>, fill?: string }): Promise<Sent> {
  const url = new URL(options.path, baseURL)
  const piece = Buffer.alloc(options.chunk ?? 64 * 1024, options.fill ?? 'a')
  return new Promise((resolve) => {
    let settled = false
    const done = (sent: Sent) => {
      if (!settled) {
        settled = true
        resolve(sent)
      }
    }
    const req = request(url, { method: options.method ?? 'POST', headers: { 'content-type': 'application/json', 'transfer-encoding': 'chunked', ...options.headers } }, (res) => {
      res.resume()
      res.on('end', () => done({ status: res.statusCode ?? null, error: null }))
    })
    req.on('error', error => done({ status: null, error: error.message }))
    let sent = 0
    const pump = () => {
      while (sent < options.total) {
        const size = Math.min(piece.length, options.total - sent)
        sent += size
        if (!req.write(size === piece.length ? piece : piece.subarray(0, size))) {
          req.once('drain', pump)
          return
        }
      }
      req.end()
    }
    pump()
  })
}

/** Resident memory of a process, from /proc (Linux), in MB. */
function rssMB(pid: number): number {
  const line = readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find(l => l.startsWith('VmRSS:'))!
  return Number(/(\d+)/.exec(line)![1]) / 1024
}

describe('body limits', () => {
  const baseURL = inject('baseURL')

  it('refuses a chunked 3 MB body to the sign-in route with 413, signed out', async () => {
    const sent = await sendChunked(baseURL, { path: '/api/auth/login', total: 3 * MB })
    expect(sent).toEqual({ status: 413, error: null })
  })

  it('refuses a 3 MB PATCH, with Content-Length or chunked', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const big = JSON.stringify({ notes: 'x'.repeat(3 * MB) })
    expect((await api.request('PATCH', `/api/tanks/${tank}`, big, { 'content-type': 'application/json' })).status).toBe(413)
    const chunked = await sendChunked(baseURL, { method: 'PATCH', path: `/api/tanks/${tank}`, total: 3 * MB, headers: { cookie: api.cookieHeader() } })
    expect(chunked.status).toBe(413)
    // A DELETE or GET that carries a body is held to the same rule.
    expect((await sendChunked(baseURL, { method: 'DELETE', path: `/api/tanks/${tank}/events/${crypto.randomUUID()}`, total: 3 * MB })).status).toBe(413)
    expect((await sendChunked(baseURL, { method: 'GET', path: '/api/me', total: 3 * MB })).status).toBe(413)
  })

  it('lets an ordinary JSON body through, and a chunked one just under the limit', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const fine = await sendChunked(baseURL, { method: 'PATCH', path: `/api/tanks/${tank}`, total: 60 * 1024, chunk: 1000, fill: ' ', headers: { cookie: api.cookieHeader() } })
    // Sixty kilobytes of spaces is not JSON: refused by validation, not by size.
    expect(fine.status).toBe(400)
  })

  it('gives uploads their own 10 MB limit, chunked or not', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const form = fileForm(Buffer.concat([TINY_PDF, Buffer.alloc(3 * MB)]), 'survey.pdf', 'application/pdf')
    const response = await api.request('POST', `/api/tanks/${tank}/test-photos`, form)
    // A 3 MB PDF (a lab report) is within the upload limit: stored, not refused for its size.
    expect(response.status).toBe(201)
    const huge = await sendChunked(baseURL, { path: `/api/tanks/${tank}/test-photos`, total: 12 * MB, headers: { 'cookie': api.cookieHeader(), 'content-type': 'multipart/form-data; boundary=x' } })
    expect(huge.status).toBe(413)
  })

  it('gives the CSV import its own larger limit', async () => {
    const api = await new ApiClient().signIn('aquarist@tidewright.test')
    const tank = inject('fixtures').demo.tanks.lobby
    const rows = Array.from({ length: 40_000 }, (_, i) => `2026-01-01T00:00:00Z,0.25,0.1,${i % 50}`).join('\n')
    const csv = `takenAt,ammonia,nitrite,nitrate\n${rows}`
    expect(csv.length).toBeGreaterThan(MB)
    const response = await api.post(`/api/tanks/${tank}/readings/import`, { csv, dryRun: true })
    expect(response.status).toBe(200)
  })
})

describe('a flood of oversized chunked bodies', () => {
  let own: OwnServer
  beforeAll(async () => {
    own = await startOwnServer()
  })
  afterAll(async () => {
    await own?.cleanup()
  })

  it('keeps the server\'s memory flat, signed out or signed in', async () => {
    const pid = own.server.process.pid!
    const api = await new ApiClient(own.server.baseURL).signIn('client@tidewright.test')
    // Warm the routes first so the baseline includes what any first request loads.
    await sendChunked(own.server.baseURL, { path: '/api/auth/login', total: 1024 })
    const baseline = rssMB(pid)
    let peak = baseline
    const sampler = setInterval(() => {
      peak = Math.max(peak, rssMB(pid))
    }, 20)
    const flood = Array.from({ length: 12 }, (_, i) => sendChunked(own.server.baseURL, {
      method: i % 2 ? 'PATCH' : 'POST',
      path: i % 2 ? `/api/tanks/${own.fixtures.demo.tanks.lounge}` : '/api/auth/login',
      total: 24 * MB,
      headers: i % 2 ? { cookie: api.cookieHeader() } : {},
    }))
    const results = await Promise.all(flood)
    clearInterval(sampler)
    peak = Math.max(peak, rssMB(pid))
    console.log(`[body-limits] 12 chunked bodies of 24 MB: RSS baseline ${baseline.toFixed(0)} MB, peak ${peak.toFixed(0)} MB (+${(peak - baseline).toFixed(0)} MB)`)
    // Every sender was refused: 24 MB is past the drain allowance (4 MB for a JSON route), so
    // each is cut off (no status), or answered 413 if the answer got out before the cut.
    for (const result of results) expect(result.status === 413 || result.status === null, JSON.stringify(result)).toBe(true)
    // 288 MB were sent; keeping them would grow the process by at least that much.
    expect(peak - baseline).toBeLessThan(64)
    expect((await api.get('/api/me')).status).toBe(200)
  })
})
