/**
 * The CSV import takes the file itself as the request's body (Content-Type: text/csv, the
 * options in the query string), streamed to a temporary file rather than held whole: it
 * answers exactly what the file sent as JSON answers, holds the row cap and the body limit on
 * the bytes actually read (a chunked body, a Content-Length that claims more than is sent),
 * names a bad option, writes nothing on a dry run, and leaves no temporary file behind.
 * The server runs with a temp dir of the test's own, so what it leaves there can be seen.
 */
import { mkdirSync, mkdtempSync, readdirSync, rmSync } from 'node:fs'
import { request } from 'node:http'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { importTooLargeMessage, MAX_IMPORT_ROWS } from '../../shared/readings/limits'
import type { ImportPreview } from '../../shared/types/readings'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'

let own: OwnServer
let serverTmp: string
let api: ApiClient
let tank: string

beforeAll(async () => {
  serverTmp = mkdtempSync(join(tmpdir(), 'tidewright-import-stream-'))
  mkdirSync(join(serverTmp, 'tmp'))
  own = await startOwnServer({ TMPDIR: join(serverTmp, 'tmp') })
  api = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
  tank = own.fixtures.demo.tanks.lobby
})
afterAll(async () => {
  await own?.cleanup()
  if (serverTmp) rmSync(serverTmp, { recursive: true, force: true })
})

const importPath = (query = '') => `/api/tanks/${tank}/readings/import${query ? `?${query}` : ''}`
const readingsOf = () => queryFile<{ n: number }>(own.dbPath, 'SELECT count(*) AS n FROM readings WHERE tank_id = ?', tank)[0]!.n
/** What the import left in the server's temp dir. */
const leftInTmp = () => readdirSync(join(serverTmp, 'tmp')).filter(name => name.startsWith('tidewright-import-'))
const sendFile = (csv: string, query = '') => api.request<ImportPreview>('POST', importPath(query), csv, { 'content-type': 'text/csv' })

/** Hourly tests from `startHoursAgo`, CRLF, with notes that span lines and hold characters of several UTF-8 bytes. */
function fileOf(rows: number, startHoursAgo: number): string {
  const lines = ['Date,Ammonia NH3,NO2,Nitrate,pH,Temp,Salinity,Remarks']
  for (let i = 0; i < rows; i++) {
    const at = new Date(Date.now() - (startHoursAgo - i) * 3_600_000).toISOString()
    const note = i % 5 ? `Wasserwechsel ${i} µS 🐠` : `"Kalk ""hoch"",\r\nnach dem Wechsel ${i}"`
    lines.push(`${at},${(i % 8) / 4},${(i % 5) / 4},${i % 40},8.${i % 3},${77 + (i % 4)},35.${i % 2},${note}`)
  }
  lines.push('not a date,1,1,1,8,77,35,bad')
  return `${lines.join('\r\n')}\r\n`
}

/**
 * Sends `body` in pieces with Transfer-Encoding: chunked (no Content-Length), or with the
 * Content-Length given (which may claim more than is sent; the request is then left open).
 * Resolves with the answer's status and body, or null when the connection was cut.
 */
function sendRaw(path: string, body: Buffer, headers: Record<string, string>, endAfterBody = true): Promise<{ status: number, body: string } | null> {
  return new Promise((resolve) => {
    const req = request(new URL(path, own.server.baseURL), { method: 'POST', headers: { 'content-type': 'text/csv', 'cookie': api.cookieHeader(), ...headers } }, (res) => {
      let text = ''
      res.setEncoding('utf8')
      res.on('data', (piece: string) => (text += piece))
      res.on('end', () => {
        resolve({ status: res.statusCode!, body: text })
        req.destroy()
      })
    })
    req.on('error', () => resolve(null))
    let sent = 0
    const pump = () => {
      while (sent < body.length) {
        const piece = body.subarray(sent, sent + 64 * 1024)
        sent += piece.length
        if (!req.write(piece)) return void req.once('drain', pump)
      }
      if (endAfterBody) req.end()
    }
    pump()
  })
}

/** More rows than one import takes, each a few bytes: far inside the body limit. */
const tooManyRows = () => Buffer.from(`Date,NH3\n${'2026-01-01T00:00:00Z,0.1\n'.repeat(MAX_IMPORT_ROWS + 50)}`)

describe('a CSV file sent as the request\'s body', () => {
  it('answers what the file sent as JSON answers, and a dry run writes nothing', async () => {
    const csv = fileOf(700, 2000)
    const options = { basis: { ammonia: 'NH3', nitrite: 'N', nitrate: 'NO3' }, temperatureUnit: 'F', salinityMode: 'practical', mapping: { notes: 'Remarks', ammonia: 'Ammonia NH3' } }
    const query = 'basis.ammonia=NH3&basis.nitrite=N&basis.nitrate=NO3&temperatureUnit=F&mapping.notes=Remarks&mapping.ammonia=Ammonia%20NH3'
    const before = readingsOf()
    const asJson = await api.post<ImportPreview>(importPath(), { csv, ...options, dryRun: true })
    const asFile = await sendFile(csv, query)
    expect(asJson.status).toBe(200)
    expect(asFile.status, JSON.stringify(asFile.body)).toBe(200)
    expect(asFile.body).toEqual(asJson.body)
    expect(asFile.body).toMatchObject({ rows: 701, valid: 700, errorRows: 1, dryRun: true, inserted: 0 })
    expect(asFile.body.mapping).toMatchObject({ notes: 'Remarks', ammonia: 'Ammonia NH3' })
    expect(asFile.body.preview[0]!.temperatureC).toBeCloseTo(25, 6)
    expect(readingsOf()).toBe(before)
    expect(leftInTmp()).toEqual([])

    // Written from the file, the same tests the JSON way then finds already held: the same rows and keys.
    const written = await sendFile(csv, `${query}&dryRun=false`)
    expect(written.body).toMatchObject({ inserted: 700, dryRun: false })
    expect(readingsOf()).toBe(before + 700)
    const again = await api.post<ImportPreview>(importPath(), { csv, ...options, dryRun: false })
    expect(again.body).toMatchObject({ inserted: 0, duplicates: 700 })
    expect(leftInTmp()).toEqual([])
  })

  it('names a bad option in the query string', async () => {
    const csv = fileOf(3, 50)
    for (const [query, field] of [['temperatureUnit=K', 'temperatureUnit'], ['basis.ammonia=NO9&basis.nitrite=N&basis.nitrate=N', 'basis.ammonia'], ['dryRun=maybe', 'dryRun'], ['mapping.colour=Date', 'mapping.colour'], ['dryRun=true&dryRun=false', 'dryRun']] as const) {
      const answer = await sendFile(csv, query)
      expect(answer.status, query).toBe(400)
      expect((answer.body as unknown as { data: { issues: { field: string }[] } }).data.issues.map(i => i.field), query).toContain(field)
    }
    expect(leftInTmp()).toEqual([])
  })

  it('refuses an empty file beside the file field, and keeps the import to its roles', async () => {
    const empty = await sendFile('')
    expect(empty.status).toBe(400)
    expect((empty.body as unknown as { data: { issues: { field: string }[] } }).data.issues[0]!.field).toBe('csv')
    const supervisor = await new ApiClient(own.server.baseURL).signIn('supervisor@tidewright.test')
    expect((await supervisor.request('POST', importPath(), fileOf(2, 10), { 'content-type': 'text/csv' })).status).toBe(403)
    expect(leftInTmp()).toEqual([])
  })

  it('refuses a file past the row cap sent chunked with 413 and the import\'s words, writing nothing', async () => {
    const before = readingsOf()
    const answer = await sendRaw(importPath('dryRun=false'), tooManyRows(), { 'transfer-encoding': 'chunked' })
    expect(answer?.status, answer?.body.slice(0, 500)).toBe(413)
    expect(JSON.parse(answer!.body).message).toBe(importTooLargeMessage())
    expect(readingsOf()).toBe(before)
    expect(leftInTmp()).toEqual([])
  })

  it('answers 413 from the bytes read when the Content-Length claims more than is sent', async () => {
    // The claim is inside the body limit; the rows sent pass the cap; the sender then waits for an answer.
    const answer = await sendRaw(importPath('dryRun=false'), tooManyRows(), { 'content-length': String(20 * 1024 * 1024) }, false)
    expect(answer?.status).toBe(413)
    expect(JSON.parse(answer!.body).message).toBe(importTooLargeMessage())
    expect(leftInTmp()).toEqual([])
  })

  it('refuses a body past the import\'s byte limit, chunked, with the body limit\'s words', async () => {
    // One long line: no row to count, only bytes.
    const answer = await sendRaw(importPath(), Buffer.alloc(25 * 1024 * 1024, 'a'), { 'transfer-encoding': 'chunked' })
    expect(answer?.status).toBe(413)
    expect(JSON.parse(answer!.body).message).toBe('This request may carry at most 24576 KB.')
    expect(leftInTmp()).toEqual([])
  })
})
