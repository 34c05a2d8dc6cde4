/**
 * Crash safety: several clients enter readings at once, the server is killed with
 * SIGKILL mid-stream and started again on the same file. Every reading whose POST was
 * answered 2xx is there exactly once (with its audit row, written in the same
 * transaction), nothing half-written is left, and PRAGMA integrity_check passes. The
 * mail outbox, killed mid-delivery, sends everything after the restart, and only a
 * message caught between sending and being marked sent can arrive twice (with the same
 * Message-ID, so the receiving side can tell).
 */
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { integrityCheck, queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { startServer } from '../support/server'
import { READING_BODY } from './access-matrix.data'

let own: OwnServer
beforeAll(async () => {
  own = await startOwnServer()
})
afterAll(async () => {
  await own?.cleanup()
})

interface Attempt { marker: string, acknowledgedId: string | null }

describe('a server killed mid-stream', () => {
  it('keeps every acknowledged reading exactly once and a sound database', async () => {
    const { demo } = own.fixtures
    const writers = [
      { email: 'client@tidewright.test', tank: demo.tanks.lounge },
      { email: 'client@tidewright.test', tank: demo.tanks.lobby },
      { email: 'aquarist@tidewright.test', tank: demo.tanks.lounge },
      { email: 'admin@tidewright.test', tank: demo.tanks.study },
      { email: 'client3@tidewright.test', tank: demo.tanks.study },
      { email: 'aquarist2@tidewright.test', tank: demo.tanks.nano },
    ]
    const sessions = await Promise.all(writers.map(w => new ApiClient(own.server.baseURL).signIn(w.email)))
    const attempts: Attempt[] = []
    let acknowledged = 0
    let stopped = false
    const loops = writers.map(async (writer, w) => {
      for (let i = 0; !stopped; i++) {
        const attempt: Attempt = { marker: `crash-test w${w} n${i}`, acknowledgedId: null }
        attempts.push(attempt)
        try {
          const response = await sessions[w]!.post(`/api/tanks/${writer.tank}/readings`, { ...READING_BODY(), notes: attempt.marker })
          if (response.status !== 201) throw new Error(`unexpected ${response.status}: ${JSON.stringify(response.body)}`)
          attempt.acknowledgedId = response.body.reading.id
          acknowledged++
        }
        catch (error) {
          if (stopped || own.server.process.exitCode !== null || own.server.process.signalCode) return
          throw error
        }
      }
    })
    while (acknowledged < 60) await new Promise(r => setTimeout(r, 5))
    // Kill while requests are in flight: each writer has one outstanding right now.
    const exited = new Promise(resolve => own.server.process.once('exit', resolve))
    own.server.process.kill('SIGKILL')
    stopped = true
    await exited
    await Promise.all(loops)
    expect(own.server.process.signalCode).toBe('SIGKILL')

    await own.restart()
    expect(integrityCheck(own.dbPath)).toBe('ok')

    const rows = queryFile<{ id: string, notes: string }>(own.dbPath, `select id, notes from readings where notes like 'crash-test %'`)
    const byMarker = new Map<string, string[]>()
    for (const row of rows) byMarker.set(row.notes, [...(byMarker.get(row.notes) ?? []), row.id])
    const acked = attempts.filter(a => a.acknowledgedId)
    expect(acked.length).toBeGreaterThanOrEqual(60)
    for (const attempt of acked) expect(byMarker.get(attempt.marker), attempt.marker).toEqual([attempt.acknowledgedId])
    // Unanswered attempts (in flight at the kill) are there at most once.
    for (const attempt of attempts) expect((byMarker.get(attempt.marker) ?? []).length).toBeLessThanOrEqual(1)
    // No reading without the audit row of its own transaction, and no audit row without its reading.
    const orphans = queryFile<{ n: number }>(own.dbPath, `select count(*) as n from readings r where r.notes like 'crash-test %'
      and (select count(*) from audit_log a where a.action = 'reading.create' and a.entity_id = r.id) != 1`)[0]!.n
    expect(orphans).toBe(0)
    const dangling = queryFile<{ n: number }>(own.dbPath, `select count(*) as n from audit_log a where a.action = 'reading.create'
      and not exists (select 1 from readings r where r.id = a.entity_id)`)[0]!.n
    expect(dangling).toBe(0)

    // The restarted server serves the same sessions and takes new readings.
    const after = await sessions[0]!.post(`/api/tanks/${demo.tanks.lounge}/readings`, { ...READING_BODY(), notes: 'after restart' })
    expect(after.status).toBe(201)
    const list = await sessions[0]!.get(`/api/tanks/${demo.tanks.lounge}/readings?pageSize=500`)
    expect(list.status).toBe(200)
  })
})

describe('the mail outbox across a kill', () => {
  it('delivers every queued message after a restart, and only a message in flight at the kill may arrive twice', async () => {
    const { startMailCatcher, readCaughtMail } = await import('../../scripts/mail-catcher')
    const catcher = await startMailCatcher({ port: 0, file: join(own.dir, 'caught.jsonl') })
    // Forty-two resets from one address in a minute would meet the reset-mail limits; this test is about delivery, so they are raised here.
    const mailEnv = {
      NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: String(catcher.port), NUXT_WORKER_INTERVAL_MS: '200',
      NUXT_MAIL_THROTTLE_RESET_PER_ADDRESS_PER_HOUR: '100', NUXT_MAIL_THROTTLE_RESET_PER_NETWORK_PER_HOUR: '1000',
    }
    try {
      await own.server.stop()
      const port = Number(new URL(own.server.baseURL).port)
      own.server = await startServer({ dbPath: own.dbPath, port, env: { ...own.env, ...mailEnv } })
      const accounts = ['client@tidewright.test', 'client2@tidewright.test', 'client3@tidewright.test', 'aquarist@tidewright.test', 'aquarist2@tidewright.test', 'supervisor@tidewright.test', 'admin@tidewright.test']
      const queued = async () => queryFile<{ n: number }>(own.dbPath, `select count(*) as n from mail_outbox where kind = 'reset'`)[0]!.n
      const asked = new ApiClient(own.server.baseURL)
      for (let round = 0; round < 6; round++) {
        for (const email of accounts) expect((await asked.post('/api/auth/forgot-password', { email })).status).toBe(200)
      }
      const total = await queued()
      expect(total).toBe(6 * accounts.length)
      // Kill once delivery is under way but not finished.
      const sentCount = () => queryFile<{ n: number }>(own.dbPath, `select count(*) as n from mail_outbox where kind = 'reset' and status = 'sent'`)[0]!.n
      const deadline = Date.now() + 20_000
      while (sentCount() < 3 && Date.now() < deadline) await new Promise(r => setTimeout(r, 5))
      const exited = new Promise(resolve => own.server.process.once('exit', resolve))
      own.server.process.kill('SIGKILL')
      await exited
      const atKill = queryFile<{ message_id: string, status: string }>(own.dbPath, `select message_id, status from mail_outbox where kind = 'reset'`)
      const inDoubt = new Set(atKill.filter(r => r.status === 'sending').map(r => r.message_id))
      expect(atKill.filter(r => r.status === 'sent').length).toBeLessThan(total)
      // A row caught mid-send becomes due again after STALE_SENDING_MS (10 min); let that time pass on disk.
      const db = new Database(own.dbPath)
      db.prepare(`update mail_outbox set updated_at = ? where status = 'sending'`).run(new Date(Date.now() - 11 * 60_000).toISOString())
      db.close()

      own.server = await startServer({ dbPath: own.dbPath, port, env: { ...own.env, ...mailEnv } })
      const until = Date.now() + 60_000
      while (Date.now() < until && queryFile(own.dbPath, `select 1 from mail_outbox where kind = 'reset' and status != 'sent'`).length) await new Promise(r => setTimeout(r, 100))
      expect(queryFile(own.dbPath, `select status from mail_outbox where kind = 'reset' and status != 'sent'`)).toEqual([])
      expect(integrityCheck(own.dbPath)).toBe('ok')

      const strip = (id: string) => id.replace(/^<|>$/g, '')
      const delivered = new Map<string, number>()
      for (const mail of readCaughtMail(catcher.file)) delivered.set(strip(mail.messageId), (delivered.get(strip(mail.messageId)) ?? 0) + 1)
      for (const row of atKill) {
        const times = delivered.get(strip(row.message_id)) ?? 0
        expect(times, row.message_id).toBeGreaterThanOrEqual(1)
        expect(times, `${row.message_id} (${row.status} at the kill)`).toBeLessThanOrEqual(inDoubt.has(row.message_id) ? 2 : 1)
      }
    }
    finally {
      await catcher.close()
    }
  })
})
