/**
 * No company slows another: while another connection holds SQLite's write lock (as the
 * heavy-work pool's CSV import does for most of a second), a save on the request loop waits
 * for it without holding the loop, so another company's reads are answered meanwhile, and the
 * save goes through once the lock is free. Past the bound (NUXT_WRITE_WAIT_MS) the save is
 * answered 503 with Retry-After, and nothing of it is written.
 *
 * The lock is held here by the test's own connection to the server's file (BEGIN IMMEDIATE):
 * to the server it is a writer on another connection, exactly like a pool thread, and it is
 * held until the test lets go, so nothing depends on timing.
 */
import Database from 'better-sqlite3'
import { afterAll, afterEach, describe, expect, it } from 'vitest'
import { fingerprint } from '../support/db-checksum'
import { OTHER_AQUARIST_EMAIL } from '../support/fixtures'
import { ApiClient, type ApiResponse } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { READING_BODY } from './access-matrix.data'

const servers: OwnServer[] = []
afterAll(async () => {
  for (const own of servers) await own.cleanup()
})

let holder: Database.Database | undefined
afterEach(() => {
  if (holder?.inTransaction) holder.exec('ROLLBACK')
  holder?.close()
  holder = undefined
})

/** Takes the database's write lock on a connection of the test's own, as a pool thread's import does. */
function holdWriteLock(dbPath: string): Database.Database {
  holder = new Database(dbPath)
  holder.exec('BEGIN IMMEDIATE')
  return holder
}

/** The request, and whether it has been answered yet. */
function tracked<T>(request: Promise<ApiResponse<T>>): { answer: Promise<ApiResponse<T>>, answered: () => boolean } {
  let done = false
  const answer = request.finally(() => {
    done = true
  })
  return { answer, answered: () => done }
}

describe('a save while another connection holds the write lock', () => {
  it('waits without holding the loop: another company is served meanwhile, and the save then goes through', async () => {
    const own = await startOwnServer()
    servers.push(own)
    const { demo, other } = own.fixtures
    const client = await new ApiClient(own.server.baseURL).signIn('client@tidewright.test')
    const otherAquarist = await new ApiClient(own.server.baseURL).signIn(OTHER_AQUARIST_EMAIL)
    // Read once first: the other company's verdicts are then stored and fresh, so its reads below write nothing.
    expect((await otherAquarist.get('/api/tanks')).status).toBe(200)

    const lock = holdWriteLock(own.dbPath)
    const save = tracked(client.post(`/api/tanks/${demo.tanks.lounge}/readings`, { ...READING_BODY(), notes: 'saved after the lock' }))
    // Reads one after another: the save has long arrived and is waiting before the last of them.
    for (let i = 0; i < 20; i++) {
      const list = await otherAquarist.get<{ items: { id: string }[] }>('/api/tanks')
      expect(list.status).toBe(200)
      expect(list.body.items.map(t => t.id)).toContain(other.tankId)
    }
    expect(save.answered()).toBe(false)

    lock.exec('COMMIT')
    const saved = await save.answer
    expect(saved.status).toBe(201)
    const stored = await client.get<{ items: { notes: string | null }[] }>(`/api/tanks/${demo.tanks.lounge}/readings?pageSize=500`)
    expect(stored.body.items.filter(r => r.notes === 'saved after the lock')).toHaveLength(1)
  })

  it('answers 503 with Retry-After past the bound, and writes nothing', async () => {
    const own = await startOwnServer({ NUXT_WRITE_WAIT_MS: '50' })
    servers.push(own)
    const { demo } = own.fixtures
    const client = await new ApiClient(own.server.baseURL).signIn('client@tidewright.test')
    const before = fingerprint(own.dbPath)

    const lock = holdWriteLock(own.dbPath)
    const refused = await client.post<{ message: string }>(`/api/tanks/${demo.tanks.lounge}/readings`, { ...READING_BODY(), notes: 'refused while locked' })
    lock.exec('ROLLBACK')
    expect(refused.status).toBe(503)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(refused.body.message).toMatch(/nothing was saved/i)
    expect(fingerprint(own.dbPath)).toEqual(before)

    // Once the lock is free the same save goes through.
    const saved = await client.post(`/api/tanks/${demo.tanks.lounge}/readings`, { ...READING_BODY(), notes: 'refused while locked' })
    expect(saved.status).toBe(201)
  })
})

describe('a signed-in read while another connection holds the write lock', () => {
  it('is answered at once when its session is only due its once-a-minute touch; the touch waits for a read that finds the lock free', async () => {
    const own = await startOwnServer({ NUXT_TEST_HOOKS: '1' })
    servers.push(own)
    const client = await new ApiClient(own.server.baseURL).signIn('client@tidewright.test')
    const minutesOn = (minutes: number) => ({ 'x-tidewright-test-now': new Date(Date.now() + minutes * 60_000).toISOString() })
    const lastSeen = (): string => {
      const reader = new Database(own.dbPath, { readonly: true })
      try {
        return (reader.prepare('SELECT last_seen_at AS at FROM sessions ORDER BY created_at DESC, rowid DESC LIMIT 1').get() as { at: string }).at
      }
      finally {
        reader.close()
      }
    }
    expect((await client.get('/api/me')).status).toBe(200)
    const signedInAt = lastSeen()

    // Two minutes on, the session is due a touch; held until the bound (5 s), it would be answered 503.
    const lock = holdWriteLock(own.dbPath)
    const read = await client.request('GET', '/api/me', undefined, minutesOn(2))
    expect(read.status).toBe(200)
    expect(lastSeen()).toBe(signedInAt)
    lock.exec('COMMIT')

    const touched = await client.request('GET', '/api/me', undefined, minutesOn(3))
    expect(touched.status).toBe(200)
    expect(Date.parse(lastSeen())).toBeGreaterThan(Date.parse(signedInAt) + 2 * 60_000)
  })

  it('still ends a session past its idle lifetime, waiting for the lock to do it', async () => {
    const own = await startOwnServer({ NUXT_TEST_HOOKS: '1', NUXT_WRITE_WAIT_MS: '50' })
    servers.push(own)
    const client = await new ApiClient(own.server.baseURL).signIn('client@tidewright.test')
    const daysOn = { 'x-tidewright-test-now': new Date(Date.now() + 4 * 86_400_000).toISOString() }
    const lock = holdWriteLock(own.dbPath)
    // Ending is a write the refusal must not skip: past the bound the read is refused, not let in.
    expect((await client.request('GET', '/api/me', undefined, daysOn)).status).toBe(503)
    lock.exec('ROLLBACK')
    expect((await client.request('GET', '/api/me', undefined, daysOn)).status).toBe(401)
  })
})
